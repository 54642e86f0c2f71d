/**
 * fetch for component tests: the test answers the requests it expects; any other request is
 * recorded, answered 599, and fails the test when it ends (the app turns fetch errors into
 * messages, so an error alone would not). Call `useFetchStub` or `useMockedApi` at the top of a
 * test file: they register their own beforeEach/afterEach (the afterEach also cleans up the DOM).
 */
import { cleanup } from '@testing-library/react';
import { afterEach, beforeEach, expect, vi } from 'vitest';

export interface SentRequest {
  method: string;
  path: string;
  /** "METHOD /path", as the tests name routes. */
  key: string;
  /** The JSON body parsed, when the body was a string. */
  body: unknown;
  headers: Record<string, string>;
}

export type Answer = (request: SentRequest, init: RequestInit | undefined) => Response | undefined | Promise<Response | undefined>;

export interface FetchStub {
  /** Every request of the current test, in order. */
  sent: SentRequest[];
  /** The requests nobody answered ("METHOD /path"). */
  unmocked: string[];
}

export const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

export function useFetchStub(answer: Answer): FetchStub {
  const stub: FetchStub = { sent: [], unmocked: [] };
  beforeEach(() => {
    stub.sent = [];
    stub.unmocked = [];
    vi.stubGlobal('fetch', async (input: RequestInfo | URL, init?: RequestInit) => {
      const method = init?.method ?? 'GET';
      const path = String(input);
      const body = typeof init?.body === 'string' ? (JSON.parse(init.body) as unknown) : undefined;
      const request: SentRequest = { method, path, key: `${method} ${path}`, body, headers: (init?.headers ?? {}) as Record<string, string> };
      stub.sent.push(request);
      const answered = await answer(request, init);
      if (answered) return answered;
      stub.unmocked.push(request.key);
      return json(599, { error: 'not mocked' });
    });
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
    expect(stub.unmocked, 'requests nobody mocked').toEqual([]);
  });
  return stub;
}

export interface MockedAnswer {
  status: number;
  body: unknown;
}

export interface MockedApi extends FetchStub {
  /** Answers by "METHOD /path"; each test starts with only `GET /api/auth/csrf` (token "csrf-token"). */
  routes: Record<string, MockedAnswer>;
}

/** `useFetchStub` answering from a table the test fills in. */
export function useMockedApi(): MockedApi {
  let routes: Record<string, MockedAnswer> = {};
  const stub = useFetchStub((request) => {
    const mocked = routes[request.key];
    return mocked && json(mocked.status, mocked.body);
  });
  beforeEach(() => {
    routes = { 'GET /api/auth/csrf': { status: 200, body: { token: 'csrf-token' } } };
  });
  return {
    get sent() {
      return stub.sent;
    },
    get unmocked() {
      return stub.unmocked;
    },
    get routes() {
      return routes;
    },
  };
}
