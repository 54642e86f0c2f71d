/**
 * An API call from inside the page, with the page's own session cookie and a valid CSRF token,
 * as the app itself would send it: shows what the server answers this user directly (a 403 is
 * the server refusing the role, not the UI hiding a button).
 */
import type { Page } from 'playwright-core';

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export interface PageApiAnswer {
  status: number;
  code: string | null;
}

/** The status and the JSON body ({} when there is none; its shape is the caller's to name). */
export async function jsonFromPage<T = Record<string, unknown>>(page: Page, method: Method, url: string, body?: unknown): Promise<{ status: number; body: T }> {
  const answer = await page.evaluate(
    async ({ method, url, body }) => {
      const headers: Record<string, string> = { Accept: 'application/json' };
      if (method !== 'GET') {
        const csrf = (await fetch('/api/auth/csrf', { credentials: 'same-origin' }).then((r) => r.json())) as { token: string };
        headers['X-CSRF-Token'] = csrf.token;
        headers['Content-Type'] = 'application/json';
      }
      const response = await fetch(url, { method, headers, credentials: 'same-origin', body: method === 'GET' ? undefined : JSON.stringify(body ?? {}) });
      return { status: response.status, body: (await response.json().catch(() => ({}))) as unknown };
    },
    { method, url, body },
  );
  return answer as { status: number; body: T };
}

/** The status and the error code of the answer (null when it has none). */
export async function apiFromPage(page: Page, method: Method, url: string, body?: unknown): Promise<PageApiAnswer> {
  const answer = await jsonFromPage<{ code?: string }>(page, method, url, body);
  return { status: answer.status, code: answer.body.code ?? null };
}
