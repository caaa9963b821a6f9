import type { HealthDto } from '../../../../policies/dto';
import { publicRoute, type RouteDef } from '../../http/route';

export const healthRoutes: RouteDef[] = [
  publicRoute({
    method: 'get',
    path: '/health',
    summary: 'Is the app up, and can it reach its database?',
    access: { kind: 'public' },
    async handler({ ds, res }) {
      let database: HealthDto['database'];
      try {
        await Promise.race([
          ds.query('SELECT 1'),
          new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), 2000).unref()),
        ]);
        database = 'up';
      } catch {
        database = 'down';
      }
      const body: HealthDto = { status: database === 'up' ? 'ok' : 'degraded', database };
      res.status(database === 'up' ? 200 : 503).json(body);
      return body;
    },
  }),
];
