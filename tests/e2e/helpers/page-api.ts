/**
 * An API call from inside the page, with the page's own session cookie and a valid CSRF token,
 * as the app itself would send it: shows what the server answers this user directly (a 403 is
 * the server refusing the role, not the UI hiding a button).
 */
import type { Page } from 'playwright-core';

export interface PageApiAnswer<T = Record<string, unknown>> {
  status: number;
  code: string | null;
  /** The answer's JSON body ({} when it has none). */
  body: T;
}

export async function apiFromPage<T = Record<string, unknown>>(page: Page, method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE', url: string, body?: unknown): Promise<PageApiAnswer<T>> {
  const answer = await page.evaluate(
    async ({ method, url, body }) => {
      const headers: Record<string, string> = { Accept: 'application/json' };
      if (method !== 'GET') {
        const csrf = (await fetch('/api/auth/csrf', { credentials: 'same-origin' }).then((r) => r.json())) as { token: string };
        headers['X-CSRF-Token'] = csrf.token;
        headers['Content-Type'] = 'application/json';
      }
      const response = await fetch(url, { method, headers, credentials: 'same-origin', body: method === 'GET' ? undefined : JSON.stringify(body ?? {}) });
      const payload = (await response.json().catch(() => ({}))) as { code?: string };
      return { status: response.status, code: payload.code ?? null, body: payload };
    },
    { method, url, body },
  );
  // The body is the page's parsed JSON: its shape is the caller's to name.
  return answer as PageApiAnswer<T>;
}
