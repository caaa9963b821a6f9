import { NothingSchema } from '../../../../policies/schemas';
import { publicRoute, type RouteDef } from '../../http/route';
import { health } from '../../queries/health';

export const healthRoutes: RouteDef[] = [
  publicRoute({
    method: 'get',
    path: '/health',
    summary: 'Is the app up, and can it reach its database?',
    access: { kind: 'public' },
    params: NothingSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ deps, res }) {
      const body = await health(deps);
      res.status(body.database === 'up' ? 200 : 503).json(body);
      return body;
    },
  }),
];
