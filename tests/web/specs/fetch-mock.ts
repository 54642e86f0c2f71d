/**
 * fetch for web tests: each test lists the requests it expects ("PUT /api/specs/7") with the
 * answer; anything else is recorded and refused, and `assertNoUnexpectedRequests` fails the test.
 */
import { vi } from 'vitest';

export interface MockAnswer {
  status: number;
  body?: unknown;
}

type Handler = (body: unknown) => MockAnswer;

export function mockFetch(routes: Record<string, MockAnswer | Handler>) {
  const unexpected: string[] = [];
  const requests: { key: string; body: unknown }[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = typeof input === 'string' ? input : input instanceof URL ? input.pathname + input.search : input.url;
    const key = `${init?.method ?? 'GET'} ${url}`;
    const body = typeof init?.body === 'string' ? (JSON.parse(init.body) as unknown) : undefined;
    requests.push({ key, body });
    const route = routes[key];
    if (!route) {
      unexpected.push(key);
      throw new TypeError(`unmocked request ${key}`);
    }
    const answer = typeof route === 'function' ? route(body) : route;
    return { ok: answer.status >= 200 && answer.status < 300, status: answer.status, json: async () => answer.body ?? {} } as Response;
  });
  vi.stubGlobal('fetch', fetchMock);
  return {
    requests,
    assertNoUnexpectedRequests: () => {
      if (unexpected.length > 0) throw new Error(`unexpected requests: ${unexpected.join(', ')}`);
    },
  };
}
