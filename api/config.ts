/**
 * The server's configuration: process.env read once into a typed object, defaults for the
 * embedded local run, and a start-up failure listing every problem.
 */
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';

export interface Config {
  port: number;
  /** SQLite file path. */
  databasePath: string;
  sessionSecret: string;
  production: boolean;
  /** Seed the demo organisation on an empty database (default: on unless production). */
  seedDemo: boolean;
  demoPassword: string;
  /** Production: the first admin, created on an empty database. */
  firstAdmin: { email: string; password: string } | null;
  /** Serve cookies with the Secure flag only behind HTTPS (set when a proxy terminates TLS). */
  trustProxy: boolean;
}

export const DEFAULT_DEMO_PASSWORD = 'longtail-demo-2026';

/** A session secret kept beside the database, so local sign-ins survive a restart. */
function localSessionSecret(databasePath: string): string {
  const file = resolve(dirname(databasePath), 'session-secret');
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  mkdirSync(dirname(file), { recursive: true });
  const secret = randomBytes(32).toString('hex');
  writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}

/** Reads the environment; throws one error listing every problem. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const problems: string[] = [];
  const production = env.NODE_ENV === 'production';
  const port = Number(env.PORT ?? 3000);
  if (!Number.isInteger(port) || port < 1 || port > 65535) problems.push(`PORT must be a port number, got "${env.PORT}"`);
  const databasePath = resolve(env.LONGTAIL_DB ?? 'data/longtail.sqlite');
  let sessionSecret = env.LONGTAIL_SESSION_SECRET ?? '';
  if (sessionSecret === '' && production) problems.push('LONGTAIL_SESSION_SECRET is required in production');
  if (sessionSecret !== '' && sessionSecret.length < 32) problems.push('LONGTAIL_SESSION_SECRET must be at least 32 characters');
  const demoPassword = env.LONGTAIL_DEMO_PASSWORD ?? DEFAULT_DEMO_PASSWORD;
  if (demoPassword.length < 12) problems.push('LONGTAIL_DEMO_PASSWORD must be at least 12 characters');
  const adminEmail = env.LONGTAIL_ADMIN_EMAIL;
  const adminPassword = env.LONGTAIL_ADMIN_PASSWORD;
  if ((adminEmail === undefined) !== (adminPassword === undefined)) problems.push('LONGTAIL_ADMIN_EMAIL and LONGTAIL_ADMIN_PASSWORD go together');
  if (adminPassword !== undefined && adminPassword.length < 12) problems.push('LONGTAIL_ADMIN_PASSWORD must be at least 12 characters');
  if (problems.length > 0) throw new Error(`Configuration problems:\n- ${problems.join('\n- ')}`);
  if (sessionSecret === '') sessionSecret = localSessionSecret(databasePath);
  return {
    port,
    databasePath,
    sessionSecret,
    production,
    seedDemo: env.LONGTAIL_SEED !== undefined ? env.LONGTAIL_SEED === 'true' : !production,
    demoPassword,
    firstAdmin: adminEmail && adminPassword ? { email: adminEmail, password: adminPassword } : null,
    trustProxy: env.LONGTAIL_TRUST_PROXY === 'true',
  };
}
