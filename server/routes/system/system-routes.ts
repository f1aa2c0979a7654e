import type { AppContext } from '../../app-context';
import { route, type AnyRouteSpec } from '../../http/route';
import { Health } from '../../../shared/schemas/health';

const HEALTH_TIMEOUT_MS = 2_000;

export function systemRoutes(context: AppContext, openApiDocument: () => unknown): AnyRouteSpec[] {
  return [
    route({
      method: 'get',
      path: '/health',
      tag: 'System',
      summary: 'Whether the server and its database answer (503 when the database does not)',
      access: 'public',
      response: Health,
      errors: [503],
      handler: async ({ res }) => {
        try {
          await context.knex.raw('select 1').timeout(HEALTH_TIMEOUT_MS, { cancel: true });
          return { status: 'ok' as const, db: 'ok' as const };
        } catch {
          res.status(503).json({ status: 'degraded', db: 'unavailable' });
        }
      },
    }),
    route({
      method: 'get',
      path: '/openapi.json',
      tag: 'System',
      summary: 'This description of the API, generated from its zod schemas',
      access: 'public',
      successStatus: 200,
      handler: ({ res }) => {
        res.json(openApiDocument());
      },
    }),
  ];
}
