/**
 * The API's OpenAPI 3.1 description, read from the app itself: every route Express has
 * registered (method and path), and for each the JSON Schema its validating middleware checks
 * the body, query or multipart upload against (api/validation/bodies.ts through validateBody,
 * validateQuery and fileUpload). Nothing here restates a body: a route whose schema changes is
 * described anew on the next request. Answers are described by their status and the common error
 * shape only (the wire types are in shared/api).
 */
import type { Express } from 'express';
import { checkedPart, type CheckedPart } from './validation/validate-request';

export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** One registered route: its method, its Express path (`/api/specs/:id`), and what its middleware checks. */
export interface RegisteredRoute {
  method: HttpMethod;
  path: string;
  checks: CheckedPart[];
}

interface Layer {
  rawPath?: string;
  route?: { path: string; methods: Record<string, boolean>; stack: { handle: unknown }[] };
  handle: { stack?: Layer[] };
}

/** Every (method, path) the app registers, read from Express 5's router, with the checks of each. */
export function registeredRoutes(app: Express): RegisteredRoute[] {
  const routes = new Map<string, RegisteredRoute>();
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const path = `${prefix}${layer.route.path === '/' ? '' : layer.route.path}`;
        const checks = layer.route.stack.map((step) => checkedPart(step.handle)).filter((check): check is CheckedPart => check !== undefined);
        for (const method of Object.keys(layer.route.methods)) {
          if (method === '_all') continue;
          routes.set(`${method} ${path}`, { method: method as HttpMethod, path, checks });
        }
      } else if (layer.handle.stack) {
        walk(layer.handle.stack, `${prefix}${layer.rawPath === '/' ? '' : (layer.rawPath ?? '')}`);
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  return [...routes.values()].sort((a, b) => a.path.localeCompare(b.path) || a.method.localeCompare(b.method));
}

/** `/api/specs/:id/diff` → `/api/specs/{id}/diff`, and the parameter names in order. */
function templated(path: string): { path: string; names: string[] } {
  const names: string[] = [];
  const out = path.replace(/:(\w+)/g, (_m, name: string) => {
    names.push(name);
    return `{${name}}`;
  });
  return { path: out, names };
}

/**
 * A JSON Schema as an OpenAPI 3.1 Schema Object: a shared document inside it (one with an `$id`,
 * the design schema in a decision body, say) becomes a reference to components.schemas, stored
 * there once without its draft-07 `$schema` (the document's dialect is 2020-12).
 */
function schemaObject(schema: unknown, components: Record<string, object>): unknown {
  if (Array.isArray(schema)) return schema.map((item) => schemaObject(item, components));
  if (schema === null || typeof schema !== 'object') return schema;
  const { $schema: _dialect, $id: id, ...rest } = schema as Record<string, unknown>;
  const inner = Object.fromEntries(Object.entries(rest).map(([key, value]) => [key, schemaObject(value, components)]));
  if (typeof id !== 'string') return inner;
  const name = String(rest.title ?? id.replace(/^.*\/|\..*$/g, '')).replace(/[^A-Za-z0-9]/g, '');
  components[name] = inner;
  return { $ref: `#/components/schemas/${name}` };
}

/** One query parameter per property of a query schema (required ones marked). */
function queryParameters(schema: object): object[] {
  const { properties = {}, required = [] } = schema as { properties?: Record<string, object>; required?: string[] };
  return Object.entries(properties).map(([name, field]) => ({ name, in: 'query', required: required.includes(name), schema: field }));
}

const ERROR_ANSWER = { description: 'Refused: the error shape (code, message, details per field).', content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } } };

function operation(route: RegisteredRoute, components: Record<string, object>): object {
  const { names } = templated(route.path);
  const parameters: object[] = names.map((name) => ({ name, in: 'path', required: true, schema: { type: 'integer', minimum: 1 } }));
  let requestBody: object | undefined;
  for (const check of route.checks) {
    if (check.part === 'query') parameters.push(...queryParameters(check.schema));
    if (check.part === 'body') requestBody = { required: true, content: { 'application/json': { schema: schemaObject(check.schema, components) } } };
    if (check.part === 'multipart') requestBody = { required: true, content: { 'multipart/form-data': { schema: check.schema } } };
  }
  const write = route.method !== 'get';
  if (write) {
    parameters.push({
      name: 'X-CSRF-Token',
      in: 'header',
      required: false,
      description: 'Needed with a session cookie (from GET /api/auth/csrf); not with a personal API token (Authorization: Bearer).',
      schema: { type: 'string' },
    });
  }
  return {
    operationId: `${route.method}${route.path.replace(/^\/api/, '').replace(/[^A-Za-z0-9]+(\w)?/g, (_m, c: string | undefined) => (c ?? '').toUpperCase())}`,
    ...(parameters.length > 0 ? { parameters } : {}),
    ...(requestBody ? { requestBody } : {}),
    responses: {
      '2XX': { description: 'Done: JSON (or the file the path names: .csv, .cir).' },
      '4XX': ERROR_ANSWER,
    },
  };
}

/** The OpenAPI 3.1 document of `app`'s routes under /api. */
export function openApiDocument(app: Express, version: string): object {
  const paths: Record<string, Record<string, object>> = {};
  const shared: Record<string, object> = {};
  for (const route of registeredRoutes(app)) {
    if (!route.path.startsWith('/api/')) continue;
    const key = templated(route.path).path;
    paths[key] = { ...paths[key], [route.method]: operation(route, shared) };
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Longtail API',
      version,
      description:
        'Requirement specs, ranked tail-current-source proposals, decisions, reviews and SPICE checks. Every figure is an estimate to confirm by simulation and bench measurement.',
    },
    servers: [{ url: '/' }],
    paths,
    components: {
      schemas: {
        ...shared,
        Error: {
          type: 'object',
          required: ['error', 'code'],
          properties: {
            error: { type: 'string' },
            code: { type: 'string' },
            details: { type: 'array', items: { type: 'object', properties: { path: { type: 'string' }, message: { type: 'string' } } } },
          },
        },
      },
      securitySchemes: {
        session: { type: 'apiKey', in: 'cookie', name: 'longtail.sid', description: 'A browser session from POST /api/auth/login (writes also need X-CSRF-Token).' },
        token: { type: 'http', scheme: 'bearer', description: 'A personal API token from the profile page: the person’s own projects and roles, no CSRF token.' },
      },
    },
    security: [{ session: [] }, { token: [] }, {}],
  };
}
