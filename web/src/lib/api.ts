/**
 * The one fetch wrapper: same-origin cookies, JSON in and out, the CSRF token on every
 * state-changing request (fetched once, refreshed on a 403 csrf-failed), and ApiError for any
 * non-2xx answer with the server's message, code and field details.
 */
import { api } from '../config/paths';
import type { ErrorDetail } from '#shared/api/errors';

export type { ErrorDetail };

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: ErrorDetail[];

  constructor(status: number, code: string, message: string, details: ErrorDetail[] = []) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }
}

let csrfToken: Promise<string> | null = null;

function fetchCsrfToken(): Promise<string> {
  csrfToken ??= fetch(api.csrf, { credentials: 'same-origin' })
    .then((r) => r.json() as Promise<{ token: string }>)
    .then((body) => body.token)
    .catch((error: unknown) => {
      csrfToken = null;
      throw error;
    });
  return csrfToken;
}

async function send<T>(method: string, url: string, body?: unknown, retried = false): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  // A FormData body is sent as is: the browser writes its multipart Content-Type with the boundary.
  const form = typeof FormData !== 'undefined' && body instanceof FormData;
  if (body !== undefined && !form) headers['Content-Type'] = 'application/json';
  if (method !== 'GET') headers['X-CSRF-Token'] = await fetchCsrfToken();
  let response: Response;
  try {
    response = await fetch(url, { method, headers, credentials: 'same-origin', body: body === undefined ? undefined : form ? (body as FormData) : JSON.stringify(body) });
  } catch {
    throw new ApiError(0, 'network', 'The server cannot be reached. Check that Longtail is running, then try again.');
  }
  if (response.status === 204) return undefined as T;
  const payload = (await response.json().catch(() => ({}))) as { error?: string; code?: string; details?: ErrorDetail[] };
  if (!response.ok) {
    if (response.status === 403 && payload.code === 'csrf-failed' && !retried) {
      csrfToken = null;
      return send<T>(method, url, body, true);
    }
    throw new ApiError(response.status, payload.code ?? 'error', payload.error ?? `The server answered ${response.status}.`, payload.details ?? []);
  }
  return payload as T;
}

export const apiClient = {
  get: <T>(url: string) => send<T>('GET', url),
  post: <T>(url: string, body?: unknown) => send<T>('POST', url, body ?? {}),
  put: <T>(url: string, body: unknown) => send<T>('PUT', url, body),
  patch: <T>(url: string, body: unknown) => send<T>('PATCH', url, body),
  delete: <T>(url: string) => send<T>('DELETE', url),
  /** POST (or PUT, a replacement) multipart/form-data (a file upload), with the CSRF token like every other write. */
  upload: <T>(url: string, form: FormData, method: 'POST' | 'PUT' = 'POST') => send<T>(method, url, form),
  /** After sign-in or sign-out the session changes: fetch a fresh token next time. */
  resetCsrf: () => {
    csrfToken = null;
  },
};
