import { loadConfig } from './config';
import { createLogger } from './logger';
import { startServer } from './server';

/** Runs the server alone, against DATABASE_URL (the database must exist and be migrated). */
const config = loadConfig();
const logger = createLogger(config.LOG_LEVEL);
const running = await startServer(config, logger);
logger.info(`Loadline listening on ${running.url}`);

let exiting = false;
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    if (exiting) {
      // A second signal while draining: stop now.
      logger.warn(`${signal} again: exiting without waiting`);
      process.exit(1);
    }
    exiting = true;
    logger.info(`${signal}: finishing in-flight requests, then stopping`);
    running.stop().then(
      () => process.exit(0),
      (err) => {
        logger.error({ err }, 'shutdown failed');
        process.exit(1);
      },
    );
  });
}
