/**
 * Shared pieces of the reliability run (`npm run reliability`, tests/reliability/run.ts): the
 * summary rows every part returns, a cookie-keeping HTTP client for a server on 127.0.0.1, the
 * real server as a child process on a free port, and small number helpers. Loopback only: every
 * address here is 127.0.0.1.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export const repoRoot = resolve(fileURLToPath(new URL('.', import.meta.url)), '..', '..');

/** One line of the final table. `info` rows report a figure that has no requirement. */
export interface SummaryRow {
  part: string;
  measure: string;
  value: string;
  requirement: string;
  verdict: 'pass' | 'FAIL' | 'info';
}

export interface PartResult {
  rows: SummaryRow[];
}

/** Options every part gets from run.ts. */
export interface RunOptions {
  quick: boolean;
  /** performance.now() by which the part must have finished (it stops its loops early when near). */
  deadline: number;
  /** Detail lines, printed as the part goes. */
  log: (line: string) => void;
}

export const row = (part: string, measure: string, value: string | number, requirement: string, ok: boolean | null): SummaryRow => ({
  part,
  measure,
  value: String(value),
  requirement,
  verdict: ok === null ? 'info' : ok ? 'pass' : 'FAIL',
});

/** The demo accounts (api/seed/demo-seed.ts) and the password the run gives the server. */
export const DEMO_PASSWORD = 'reliability-demo-password-2026';
export const demoEmail = (role: 'admin' | 'requirements' | 'designer' | 'reviewer') => `${role}@demo.longtail.test`;

export const sleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

/** Nearest-rank percentile of sorted values. */
export function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length, Math.max(1, Math.ceil((p / 100) * sorted.length))) - 1];
}

/** A TCP port nobody listens on right now (the kernel's pick on 127.0.0.1). */
export function freePort(): Promise<number> {
  return new Promise((resolvePort, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as { port: number };
      probe.close(() => resolvePort(port));
    });
  });
}

/** A fresh temp dir (removed by the returned function). */
export function tempDir(prefix: string): { dir: string; remove: () => void } {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  return { dir, remove: () => rmSync(dir, { recursive: true, force: true }) };
}

/**
 * A signed-in (or anonymous) HTTP client with its own cookie jar and CSRF token. Every request
 * carries the token; answers are read whole. Network failures (the server was killed) throw.
 */
export class HttpClient {
  private cookies = new Map<string, string>();
  csrfToken = '';

  constructor(readonly baseUrl: string) {}

  private store(response: Response): void {
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const eq = pair.indexOf('=');
      this.cookies.set(pair.slice(0, eq).trim(), pair.slice(eq + 1).trim());
    }
  }

  get cookieHeader(): string {
    return [...this.cookies].map(([name, value]) => `${name}=${value}`).join('; ');
  }

  /** Headers that make another tool (autocannon) speak as this client. */
  headers(): Record<string, string> {
    return { cookie: this.cookieHeader, 'x-csrf-token': this.csrfToken };
  }

  async request(method: string, path: string, body?: unknown, timeoutMs = 30_000): Promise<{ status: number; json: unknown; text: string }> {
    const headers: Record<string, string> = { cookie: this.cookieHeader, 'x-csrf-token': this.csrfToken };
    let payload: string | FormData | undefined;
    if (body instanceof FormData) payload = body;
    else if (body !== undefined) {
      headers['content-type'] = 'application/json';
      payload = JSON.stringify(body);
    }
    const response = await fetch(`${this.baseUrl}${path}`, { method, headers, body: payload, signal: AbortSignal.timeout(timeoutMs) });
    this.store(response);
    const text = await response.text();
    let json: unknown = null;
    try {
      json = text ? JSON.parse(text) : null;
    } catch {
      json = null;
    }
    return { status: response.status, json, text };
  }

  async csrf(): Promise<void> {
    const answer = await this.request('GET', '/api/auth/csrf');
    if (answer.status !== 200) throw new Error(`GET /api/auth/csrf answered ${answer.status}`);
    this.csrfToken = (answer.json as { token: string }).token;
  }

  async signIn(email: string, password: string): Promise<void> {
    await this.csrf();
    const answer = await this.request('POST', '/api/auth/login', { email, password });
    if (answer.status !== 200) throw new Error(`sign-in as ${email} answered ${answer.status}: ${answer.text}`);
    // Sign-in starts a new session, with a new CSRF token.
    this.csrfToken = (answer.json as { csrfToken: string }).csrfToken;
  }
}

/** The server (api/server.ts) as a child process: node with tsx's loader, so a SIGKILL reaches the server itself. */
export interface ServerProcess {
  port: number;
  baseUrl: string;
  child: ChildProcess;
  /** Its output so far (start-up problems are shown from it). */
  output: () => string;
}

export interface ServerSettings {
  databasePath: string;
  port: number;
  /** Seed the demo organisation (only takes effect on an empty database). */
  seed: boolean;
}

export function spawnServer(settings: ServerSettings): ServerProcess {
  const child = spawn(process.execPath, ['--import', 'tsx', 'api/server.ts'], {
    cwd: repoRoot,
    env: {
      ...process.env,
      NODE_ENV: 'development',
      PORT: String(settings.port),
      LONGTAIL_DB: settings.databasePath,
      LONGTAIL_SEED: settings.seed ? 'true' : 'false',
      LONGTAIL_DEMO_PASSWORD: DEMO_PASSWORD,
      LONGTAIL_LOCAL_SMTP_PORT: '0',
      LONGTAIL_SESSION_SECRET: 'reliability-session-secret-0123456789abcdef',
      LONGTAIL_BASE_URL: `http://127.0.0.1:${settings.port}`,
      // The load and crash parts measure throughput and durability, not the per-person proposal limit.
      LONGTAIL_PROPOSALS_PER_MINUTE: '1000000',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const keep = (chunk: Buffer) => {
    output = (output + chunk.toString('utf8')).slice(-20_000);
  };
  child.stdout?.on('data', keep);
  child.stderr?.on('data', keep);
  return { port: settings.port, baseUrl: `http://127.0.0.1:${settings.port}`, child, output: () => output };
}

/** Waits until GET /api/auth/csrf answers 200 (the server listens and reads its database). */
export async function waitHealthy(server: ServerProcess, timeoutMs = 120_000): Promise<number> {
  const start = performance.now();
  while (performance.now() - start < timeoutMs) {
    if (server.child.exitCode !== null || server.child.signalCode !== null) {
      throw new Error(`The server exited (${server.child.exitCode ?? server.child.signalCode}) before answering:\n${server.output()}`);
    }
    try {
      const response = await fetch(`${server.baseUrl}/api/auth/csrf`, { signal: AbortSignal.timeout(2000) });
      await response.arrayBuffer();
      if (response.status === 200) return performance.now() - start;
    } catch {
      // not listening yet
    }
    await sleep(100);
  }
  throw new Error(`The server did not answer within ${timeoutMs} ms:\n${server.output()}`);
}

/** Ends the child with the signal and waits for it to be gone. */
export async function stopServer(server: ServerProcess, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  if (server.child.exitCode !== null || server.child.signalCode !== null) return;
  const gone = new Promise<void>((resolveGone) => server.child.once('exit', () => resolveGone()));
  server.child.kill(signal);
  await Promise.race([gone, sleep(15_000)]);
  if (server.child.exitCode === null && server.child.signalCode === null) {
    server.child.kill('SIGKILL');
    await gone;
  }
}

/** Resident memory of a process, bytes (Linux /proc). */
export async function residentBytes(pid: number): Promise<number> {
  const { readFile } = await import('node:fs/promises');
  const status = await readFile(`/proc/${pid}/status`, 'utf8');
  const match = /VmRSS:\s+(\d+)\s+kB/.exec(status);
  return match ? Number(match[1]) * 1024 : Number.NaN;
}

export const mb = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MB`;
