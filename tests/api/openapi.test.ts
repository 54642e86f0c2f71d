/**
 * GET /api/openapi.json: the API described as OpenAPI 3.1, checked by an independent validator of
 * the OpenAPI specification (@seriousme/openapi-schema-validator, the published 3.1 schemas), and
 * against the app's own router: every registered route is described, with the schema its
 * middleware validates with.
 */
import { Validator } from '@seriousme/openapi-schema-validator';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { registeredRoutes } from '../../api/openapi';
import { buildApiApp, type TestApi } from '../helpers/api-app';

interface Operation {
  parameters?: { name: string; in: string; required?: boolean }[];
  requestBody?: { content: Record<string, { schema: Record<string, unknown> }> };
}
interface Document {
  openapi: string;
  paths: Record<string, Record<string, Operation>>;
}

let api: TestApi;
let doc: Document;

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin'] });
  const anonymous = await api.anonymous();
  const response = await anonymous.get('/api/openapi.json');
  expect(response.status).toBe(200);
  doc = response.body as Document;
});

afterAll(async () => {
  await api?.close();
});

describe('when anyone fetches /api/openapi.json', () => {
  test('then the answer is a valid OpenAPI 3.1 document by the specification’s own schema', async () => {
    const validator = new Validator();
    const result = await validator.validate(structuredClone(doc) as unknown as Record<string, unknown>);
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
    expect(validator.version).toBe('3.1');
  });

  test('then every route the app registers under /api is described with its method, and nothing else', () => {
    const expected = registeredRoutes(api.app)
      .filter((route) => route.path.startsWith('/api/'))
      .map((route) => `${route.method} ${route.path.replace(/:(\w+)/g, '{$1}')}`)
      .sort();
    const described = Object.entries(doc.paths)
      .flatMap(([path, operations]) => Object.keys(operations).map((method) => `${method} ${path}`))
      .sort();
    expect(expected.length).toBeGreaterThan(60);
    expect(described).toEqual(expected);
    for (const route of ['post /api/specs/{id}/proposals', 'get /api/proposals/{id}', 'post /api/projects/{id}/specs/import', 'get /api/openapi.json']) expect(described).toContain(route);
  });

  test('then a JSON body is described by the schema its route validates with: what the route refuses, the schema refuses too', async () => {
    const schema = doc.paths['/api/projects']?.post?.requestBody?.content['application/json']?.schema;
    expect(schema).toMatchObject({ type: 'object', required: ['name'], additionalProperties: false });
    const admin = await api.agentFor('admin');
    const refused = await admin.post('/api/projects').send({ name: 'Brackenford rig', colour: 'teal' });
    expect(refused.status).toBe(400);
    expect(Object.keys(schema?.properties as object)).not.toContain('colour');
  });

  test('then queries, path ids, uploads and the CSRF header are described where the routes take them', () => {
    const waiting = doc.paths['/api/waiting']?.get;
    expect(waiting?.parameters).toEqual(expect.arrayContaining([expect.objectContaining({ name: 'kind', in: 'query', required: true }), expect.objectContaining({ name: 'page', in: 'query', required: false })]));
    expect(doc.paths['/api/specs/{id}']?.put?.parameters).toEqual(expect.arrayContaining([expect.objectContaining({ name: 'id', in: 'path', required: true }), expect.objectContaining({ name: 'X-CSRF-Token', in: 'header' })]));
    expect(doc.paths['/api/projects/{id}/specs/import']?.post?.requestBody?.content['multipart/form-data']?.schema).toMatchObject({ required: ['file'] });
    expect(doc.paths['/api/analyze']?.post?.requestBody?.content['application/json']?.schema).toEqual({ $ref: '#/components/schemas/Design' });
    expect((doc as unknown as { components: { schemas: Record<string, object> } }).components.schemas.Design).toMatchObject({ title: 'Design', required: expect.arrayContaining(['device', 'supply', 'tail']) });
  });
});
