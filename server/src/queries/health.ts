import type { HealthDto } from '../../../policies/dto';
import type { CoreDeps } from '../core/command';

/** Whether the database answers within two seconds: load balancers ask often and need an answer either way. */
export async function health(deps: Pick<CoreDeps, 'ds'>): Promise<HealthDto> {
  let database: HealthDto['database'];
  try {
    await Promise.race([
      deps.ds.query('SELECT 1'),
      new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), 2000).unref()),
    ]);
    database = 'up';
  } catch {
    database = 'down';
  }
  return { status: database === 'up' ? 'ok' : 'degraded', database };
}
