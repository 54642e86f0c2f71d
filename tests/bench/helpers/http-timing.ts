/**
 * Timing an app's GET requests for the list and search benchmarks: the app listening on a local
 * port, sequential requests on one kept-alive connection, signed in through the real sign-in
 * (CSRF token, session cookie), and the median of RUNS requests after a warm-up beside the
 * median of the service call alone. Plus the table rows the benchmarks print.
 */
import http from 'node:http';
import type { PublicUser } from '../../../api/services/users.service';

const RUNS = 40;
const WARM_UP = 5;

export const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
};
export const ms = (value: number) => `${value.toFixed(2)} ms`;
export const row = (name: string, value: string, note = '') => console.log(`${name.padEnd(58)} ${value.padStart(20)}   ${note}`);
export const verdict = (value: number, targetMs: number) => (value <= targetMs ? `target ≤ ${targetMs} ms: met` : `target ≤ ${targetMs} ms: NOT MET`);

interface Answer {
  status: number;
  body: string;
  cookies: string[];
}

export interface HttpTiming {
  /** Requests timed per figure. */
  runs: number;
  signIn(user: PublicUser, password: string): Promise<Record<string, string>>;
  /** Median of RUNS sequential requests after a warm-up, and of the service call alone; the first answer's body. */
  latency(path: string, session: Record<string, string>, service: () => Promise<unknown>): Promise<{ http: number; service: number; body: Record<string, unknown> }>;
  close(): Promise<void>;
}

/** Listens with the app on 127.0.0.1 (any free port) and times requests to it. */
export async function httpTiming(app: http.RequestListener): Promise<HttpTiming> {
  const server = http.createServer(app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const base = `http://127.0.0.1:${(server.address() as { port: number }).port}`;
  const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });

  function send(method: 'GET' | 'POST', path: string, headers: Record<string, string>, json?: unknown): Promise<Answer> {
    return new Promise((resolve, reject) => {
      const request = http.request(`${base}${path}`, { method, agent, headers: json === undefined ? headers : { ...headers, 'content-type': 'application/json' } }, (response) => {
        let body = '';
        response.setEncoding('utf8');
        response.on('data', (chunk: string) => (body += chunk));
        response.on('end', () => resolve({ status: response.statusCode ?? 0, body, cookies: (response.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]) }));
      });
      request.on('error', reject);
      request.end(json === undefined ? undefined : JSON.stringify(json));
    });
  }

  return {
    runs: RUNS,
    async signIn(user, password) {
      const csrf = await send('GET', '/api/auth/csrf', {});
      const login = await send('POST', '/api/auth/login', { 'x-csrf-token': (JSON.parse(csrf.body) as { token: string }).token, cookie: csrf.cookies.join('; ') }, { email: user.email, password });
      if (login.status !== 200) throw new Error(`sign-in failed: ${login.status} ${login.body}`);
      return { cookie: login.cookies.join('; ') };
    },
    async latency(path, session, service) {
      const check = await send('GET', path, session);
      if (check.status !== 200) throw new Error(`${path}: ${check.status} ${check.body}`);
      for (let i = 0; i < WARM_UP; i += 1) await send('GET', path, session);
      const httpMs: number[] = [];
      const serviceMs: number[] = [];
      for (let i = 0; i < RUNS; i += 1) {
        let started = performance.now();
        await send('GET', path, session);
        httpMs.push(performance.now() - started);
        started = performance.now();
        await service();
        serviceMs.push(performance.now() - started);
      }
      return { http: median(httpMs), service: median(serviceMs), body: JSON.parse(check.body) as Record<string, unknown> };
    },
    async close() {
      agent.destroy();
      server.closeAllConnections();
      await new Promise((resolve) => server.close(resolve));
    },
  };
}
