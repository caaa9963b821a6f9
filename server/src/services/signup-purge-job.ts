import { randomUUID } from 'node:crypto';
import type { CoreDeps } from '../core/command';
import { purgeUnconfirmedSignups } from '../commands/organization-signup';
import { runPublicCommand } from '../commands/run';

/**
 * The daily purge of sign-up requests never confirmed (commands/organization-signup.ts), run by the
 * pg-boss schedule (server.ts). A job, not a timer: it survives a restart, runs on one app server a
 * day, and a failed run is retried; the DELETE makes a second run harmless.
 */
export async function purgeSignups(deps: CoreDeps): Promise<void> {
  const { deleted } = await runPublicCommand(
    purgeUnconfirmedSignups,
    { deps, requestId: `signup-purge-${randomUUID()}`, userId: null },
    undefined,
  );
  if (deleted) deps.logger.info({ deleted }, 'unconfirmed sign-up requests deleted');
}
