import { z } from 'zod';
import { ApiErrorBody } from '../../shared/schemas/errors';
import type { AnyRouteSpec } from '../http/route';

type JsonSchema = Record<string, unknown>;

const STATUS_TEXT: Record<number, string> = {
  400: 'Malformed request (code malformed_json)',
  401: 'Not signed in, or wrong credentials',
  403: 'Your role does not allow this, or the CSRF token is missing',
  404: 'Not found',
  409: 'Conflicts with the current state',
  410: 'The link has expired or was used',
  413: 'Request too large',
  415: 'The file is not of a type the route accepts',
  422: 'Validation failed; error.fields lists each field',
  429: 'Too many attempts',
  503: 'A service (database or mail) is not answering',
};

const refTo = (id: string) => ({ $ref: `#/components/schemas/${id}` });

/**
 * A route's schema: a reference when it is registered with an id. Unregistered schemas are
 * inlined, so they must not nest registered ones (give such an envelope an id of its own).
 */
function schemaFor(schema: z.ZodType, io: 'input' | 'output'): JsonSchema {
  const id = z.globalRegistry.get(schema)?.id;
  if (id) return refTo(id);
  return z.toJSONSchema(schema, { target: 'openapi-3.0', io, unrepresentable: 'any' }) as JsonSchema;
}

/** Path parameters and query fields as OpenAPI parameters, from the route's zod objects. */
function parametersFor(spec: AnyRouteSpec): JsonSchema[] {
  const parameters: JsonSchema[] = [];
  for (const [where, schema] of [
    ['path', spec.params],
    ['query', spec.query],
  ] as const) {
    if (!schema) continue;
    const json = z.toJSONSchema(schema, { target: 'openapi-3.0', io: 'input', unrepresentable: 'any' }) as {
      properties?: Record<string, JsonSchema>;
      required?: string[];
    };
    for (const [name, property] of Object.entries(json.properties ?? {})) {
      parameters.push({ name, in: where, required: where === 'path' || (json.required ?? []).includes(name), schema: property });
    }
  }
  return parameters;
}

const toOpenApiPath = (path: string) => `/api${path.replace(/:(\w+)/g, '{$1}')}`;

function describeAccess(access: AnyRouteSpec['access']): string {
  if (access === 'public') return 'Anyone.';
  if (access === 'signed-in') return 'Any signed-in person.';
  return `Roles: ${(access as string[]).join(', ')}.`;
}

/** The OpenAPI 3 description of every mounted route, generated from the same zod schemas. */
export function buildOpenApiDocument(specs: readonly AnyRouteSpec[], serverUrl: string) {
  const { schemas } = z.toJSONSchema(z.globalRegistry, {
    target: 'openapi-3.0',
    io: 'input',
    unrepresentable: 'any',
    uri: (id) => `#/components/schemas/${id}`,
  }) as { schemas: Record<string, JsonSchema> };
  for (const schema of Object.values(schemas)) {
    delete schema.$schema;
    delete schema.$id;
  }

  const paths: Record<string, Record<string, unknown>> = {};
  for (const spec of specs) {
    const responses: Record<string, unknown> = {};
    const success = spec.successStatus ?? (spec.response || spec.producesType ? 200 : 204);
    responses[String(success)] = spec.producesType
      ? {
          description: 'Success',
          content: {
            [spec.producesType]: {
              schema:
                spec.producesType === 'application/octet-stream' ? { type: 'string', format: 'binary' } : { type: 'string' },
            },
          },
        }
      : spec.response
        ? { description: 'Success', content: { 'application/json': { schema: schemaFor(spec.response, 'output') } } }
        : { description: 'Success, no content' };
    const errorStatuses = new Set<number>(spec.errors ?? []);
    if (spec.access !== 'public') errorStatuses.add(401);
    if (Array.isArray(spec.access)) errorStatuses.add(403);
    if (spec.method !== 'get') errorStatuses.add(403);
    if (spec.body || spec.params || spec.query) errorStatuses.add(422);
    if (spec.body) errorStatuses.add(400);
    for (const status of [...errorStatuses].sort()) {
      responses[String(status)] = {
        description: STATUS_TEXT[status] ?? 'Error',
        content: { 'application/json': { schema: refTo('ApiError') } },
      };
    }
    const parameters = parametersFor(spec);
    if (spec.method !== 'get') {
      parameters.push({
        name: 'x-csrf-token',
        in: 'header',
        required: true,
        schema: { type: 'string' },
        description: 'From GET /api/auth/csrf',
      });
    }
    (paths[toOpenApiPath(spec.path)] ??= {})[spec.method] = {
      summary: spec.summary,
      description: describeAccess(spec.access),
      tags: [spec.tag],
      ...(parameters.length ? { parameters } : {}),
      ...(spec.body
        ? {
            requestBody: {
              required: true,
              content: {
                [spec.bodyType ?? 'application/json']: {
                  // A multipart upload's file part is not a zod field: it is described beside the text fields.
                  schema:
                    spec.bodyType === 'multipart/form-data'
                      ? {
                          allOf: [
                            schemaFor(spec.body, 'input'),
                            { type: 'object', properties: { file: { type: 'string', format: 'binary' } }, required: ['file'] },
                          ],
                        }
                      : schemaFor(spec.body, 'input'),
                },
              },
            },
          }
        : {}),
      responses,
    };
  }
  // Keep the error envelope in the components even if zod tree-shook nothing to it.
  schemas.ApiError ??= schemaFor(ApiErrorBody, 'output');

  return {
    openapi: '3.0.3',
    info: {
      title: 'Flakeline API',
      version: '1',
      description:
        'Sample inventory and provenance log for 2D-materials labs. Sign in with POST /api/auth/sign-in (cookie session); send the CSRF token from GET /api/auth/csrf as x-csrf-token on every mutating request.',
    },
    servers: [{ url: serverUrl }],
    components: {
      schemas,
      securitySchemes: { session: { type: 'apiKey', in: 'cookie', name: 'flakeline.sid' } },
    },
    security: [{ session: [] }],
    paths,
  };
}
