import { z } from 'zod';
import type { Route } from './routes/route';
import type { Access } from './middleware/authorize';

const describeAccess = (a: Access): string => {
  switch (a.kind) {
    case 'public':
      return 'Anyone, signed in or not.';
    case 'signed-in':
      return 'Any signed-in account.';
    case 'admin':
      return 'Platform administrators.';
    case 'fakes':
      return 'Only while the local stand-ins run (embedded mode).';
    case 'lab':
      return `Members of the lab whose role grants ${Object.entries(a.permission)
        .map(([k, v]) => `${k}: ${(v ?? []).join(', ')}`)
        .join('; ')}.`;
  }
};

const errorBody = {
  type: 'object',
  required: ['message', 'code', 'requestId'],
  properties: { message: { type: 'string' }, code: { type: 'string' }, requestId: { type: 'string' }, fields: { type: 'object', additionalProperties: { type: 'string' } } },
};

/**
 * The OpenAPI 3.1 description, generated from the route table and the same
 * zod schemas the routes parse with, so it cannot drift from the code.
 * Sign-in, sign-up and the rest of /api/auth are better-auth's own endpoints.
 */
export function buildOpenApi(routes: Route[], baseUrl: string) {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const r of routes) {
    const path = r.path.replace(/:(\w+)/g, '{$1}');
    const params = [...r.path.matchAll(/:(\w+)/g)].map((m) => ({ name: m[1], in: 'path', required: true, schema: { type: 'string' } }));
    const ok = String(r.status ?? 200);
    paths[path] ??= {};
    paths[path][r.method] = {
      summary: r.summary,
      description: `Who may call it: ${describeAccess(r.access)}`,
      ...(params.length ? { parameters: params } : {}),
      ...(r.access.kind === 'public' || r.access.kind === 'fakes' ? {} : { security: [{ sessionCookie: [] }, ...(r.access.kind === 'signed-in' && r.access.sessionOnly ? [] : [{ apiToken: [] }])] }),
      ...(r.body ? { requestBody: { required: true, content: { 'application/json': { schema: z.toJSONSchema(r.body, { io: 'input', unrepresentable: 'any' }) } } } } : {}),
      responses: {
        [ok]: {
          description: 'Success',
          ...(r.response ? { content: { 'application/json': { schema: z.toJSONSchema(r.response, { unrepresentable: 'any' }) } } } : {}),
        },
        default: { description: 'An error', content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } } },
      },
    };
  }
  return {
    openapi: '3.1.0',
    info: { title: 'Cohesia API', version: '0.1.0', description: 'Deposit, release, share and compare trajectory datasets of animal groups.' },
    servers: [{ url: baseUrl }],
    paths,
    components: {
      schemas: { Error: errorBody },
      securitySchemes: {
        sessionCookie: { type: 'apiKey', in: 'cookie', name: 'better-auth.session_token' },
        apiToken: { type: 'http', scheme: 'bearer', description: 'A personal API token (coh_…) from the account page; scope read for GET, deposit for changes.' },
      },
    },
  };
}
