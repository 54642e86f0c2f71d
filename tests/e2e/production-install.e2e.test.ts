/**
 * A production install, as servers are usually deployed: the packed project (`npm pack`, what
 * package.json "files" ships: the compiled server in dist/server, the browser app in dist/web, the
 * rule files, the demo data, the SPICE thread's script) unpacked into a scratch folder, its
 * dependencies installed from the lock file with `npm ci --omit=dev` (no tsx, no vite, no test
 * tools), then started with `NODE_ENV=production` and the settings production requires
 * (README.md, "Production start"). It must answer /api/health, serve the browser app, start the
 * SPICE engine, and the compiled `longtail` command line must rank a spec.
 *
 * Lives beside the browser tests because their globalSetup builds dist/ (tests/e2e/global-setup.ts).
 * The install builds better-sqlite3's native addon from source when no prebuilt binary can be
 * fetched (this machine reaches only the npm registry): about a minute on two cores.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { repoRoot } from './helpers/paths';

const scratch = mkdtempSync(join(tmpdir(), 'longtail-production-'));
let server: ChildProcess | null = null;
let serverLog = '';

afterAll(async () => {
  if (server && server.exitCode === null) {
    const exited = new Promise((resolve) => server?.once('exit', resolve));
    server.kill('SIGTERM');
    await exited;
  }
  rmSync(scratch, { recursive: true, force: true });
});

function run(command: string, args: string[], cwd: string, env: NodeJS.ProcessEnv = process.env): string {
  const result = spawnSync(command, args, { cwd, encoding: 'utf8', env, maxBuffer: 64 * 2 ** 20 });
  if (result.status !== 0) throw new Error(`${command} ${args.join(' ')} failed (exit ${result.status ?? result.signal}):\n${result.stdout}\n${result.stderr}`);
  return result.stdout;
}

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      probe.close(() => (typeof address === 'object' && address ? resolve(address.port) : reject(new Error('no port'))));
    });
  });
}

async function waitForHealth(url: string, timeoutMs: number): Promise<Response> {
  const deadline = Date.now() + timeoutMs;
  let lastError: unknown = null;
  while (Date.now() < deadline) {
    if (server?.exitCode !== null) throw new Error(`the production server exited (${server?.exitCode}):\n${serverLog}`);
    try {
      return await fetch(url);
    } catch (error) {
      lastError = error;
      await new Promise((resolve) => setTimeout(resolve, 250));
    }
  }
  throw new Error(`no answer from ${url} within ${timeoutMs} ms (${String(lastError)}):\n${serverLog}`);
}

describe('production install (npm pack, npm ci --omit=dev, NODE_ENV=production)', () => {
  const installDir = join(scratch, 'longtail');

  it('installs without devDependencies', () => {
    expect(existsSync(join(repoRoot, 'dist', 'server', 'server.js'))).toBe(true);
    expect(existsSync(join(repoRoot, 'dist', 'web', 'index.html'))).toBe(true);
    // --ignore-scripts: dist/ is already built by the globalSetup; a prepack build would rewrite
    // dist/web under the other browser tests' feet.
    const packed = JSON.parse(run('npm', ['pack', '--ignore-scripts', '--json', '--pack-destination', scratch], repoRoot)) as { filename: string; files: { path: string }[] }[];
    const shipped = packed[0].files.map((file) => file.path);
    expect(shipped).toContain('dist/server/server.js');
    expect(shipped).toContain('dist/web/index.html');
    expect(shipped.some((path) => path.startsWith('tests/'))).toBe(false);
    mkdirSync(installDir);
    run('tar', ['-xzf', join(scratch, packed[0].filename), '-C', installDir, '--strip-components=1'], scratch);
    // npm pack never ships the lock file; a deployment installs from it.
    copyFileSync(join(repoRoot, 'package-lock.json'), join(installDir, 'package-lock.json'));
    run('npm', ['ci', '--omit=dev', '--no-audit', '--no-fund'], installDir);
    for (const devOnly of ['tsx', 'vite', 'vitest', 'typescript', 'esbuild']) {
      expect(existsSync(join(installDir, 'node_modules', devOnly)), `${devOnly} is a devDependency and must not be installed`).toBe(false);
    }
    // The SPICE engine is a run-time dependency: it must be there and start from the install.
    const started = run(process.execPath, ['--input-type=module', '-e', "const { Simulation } = await import('eecircuit-engine'); await new Simulation().start(); console.log('spice ready');"], installDir);
    expect(started).toContain('spice ready');
  }, 600_000);

  it('starts with NODE_ENV=production, answers /api/health and serves the browser app', async () => {
    const port = await freePort();
    const env: NodeJS.ProcessEnv = {
      PATH: process.env.PATH,
      HOME: process.env.HOME,
      NODE_ENV: 'production',
      PORT: String(port),
      LONGTAIL_SESSION_SECRET: 'production-install-test-secret-0123456789abcdef',
      LONGTAIL_DB: join(scratch, 'data', 'longtail.sqlite'),
      LONGTAIL_LOCAL_SMTP_PORT: '0',
      LONGTAIL_ADMIN_EMAIL: 'ops@production-check.test',
      LONGTAIL_ADMIN_PASSWORD: 'a long first admin passphrase',
    };
    // Started from the scratch folder, not the install: the server finds its files from its own address.
    server = spawn(process.execPath, [join(installDir, 'dist', 'server', 'server.js')], { cwd: scratch, env, stdio: ['ignore', 'pipe', 'pipe'] });
    server.stdout?.on('data', (chunk: Buffer) => (serverLog += chunk.toString()));
    server.stderr?.on('data', (chunk: Buffer) => (serverLog += chunk.toString()));

    const health = await waitForHealth(`http://127.0.0.1:${port}/api/health`, 60_000);
    expect(health.status).toBe(200);
    const body = (await health.json()) as { status: string; engineVersion: string };
    expect(body.status).toBe('ok');
    const page = await fetch(`http://127.0.0.1:${port}/`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('<div id="root">');
    expect(serverLog).toContain('Created the first administrator');
    expect(serverLog).not.toContain('Seeded the demo organisation');
    expect(serverLog).not.toContain('did not start');
  }, 120_000);

  it('runs the compiled command line against a spec', () => {
    const spec = join(installDir, 'api', 'demo', 'specs', 'strain-bridge-receiver.json');
    const answer = JSON.parse(run(process.execPath, [join(installDir, 'dist', 'server', 'longtail.js'), 'recommend', spec], scratch)) as { engineVersion: string; options: unknown[] };
    const source = JSON.parse(readFileSync(join(repoRoot, 'package.json'), 'utf8')) as { name: string };
    expect(source.name).toBe('longtail');
    expect(answer.engineVersion).toMatch(/^\d+\.\d+\.\d+$/);
    expect(answer.options.length).toBeGreaterThan(0);
  }, 60_000);
});
