/**
 * The real Longtail app, in-process, for browser tests and the web benchmark: a fresh SQLite file
 * in a temp dir (migrated by openDatabase), the rule set from rules/, the demo organisation
 * (api/seed/demo-seed.ts, password DEMO_PASSWORD), and the built browser app from dist/web,
 * listening on 127.0.0.1 on an ephemeral port. It builds nothing: dist/web comes from the
 * e2e globalSetup (`npx vite build`) or `npm run build`. With `mail: true` it also starts what
 * api/server.ts starts for e-mail: the local mail server (on a free port) and the outbox worker
 * (polling every 100 ms here), so workflow e-mails reach the admin Mail page.
 */
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { DataSource } from 'typeorm';
import { createApp, type LongtailApp } from '../../../api/app';
import { openDatabase } from '../../../api/data-source';
import { startLocalSmtp, type LocalSmtp } from '../../../api/mail/local-smtp';
import { startOutboxWorker, type OutboxWorker } from '../../../api/mail/outbox-worker';
import { createMailTransport } from '../../../api/mail/transport';
import { seedDemo } from '../../../api/seed/demo-seed';
import { configureNotifications, notificationSettings } from '../../../api/services/notifications.service';
import type { RuleSet } from '#shared/engine/types';
import { loadRuleSet } from '../../../rules/index';
import { webDist } from './paths';

/** The digest window with mail on (api/mail/compose.ts has a minute): short, so a test's wait sees the digest go. */
const DIGEST_WINDOW_E2E_MS = 5_000;

/** The demo accounts' password (README). */
export const DEMO_PASSWORD = 'longtail-demo-2026';

export interface RunningServer {
  baseUrl: string;
  dataSource: DataSource;
  ruleSet: RuleSet;
  app: LongtailApp;
  /** Server errors the app logged (500s); a test expects none. */
  serverErrors: string[];
  close(): Promise<void>;
}

export interface StartOptions {
  /** Runs after the demo seed and before the server listens (the benchmark stores its proposals here). */
  prepare?: (dataSource: DataSource, ruleSet: RuleSet) => Promise<void>;
  /** Starts the local mail server and the outbox worker, as api/server.ts does. */
  mail?: boolean;
}

export async function startServer(options: StartOptions = {}): Promise<RunningServer> {
  if (!existsSync(join(webDist, 'index.html'))) {
    throw new Error(`No built browser app in ${webDist}: run \`npx vite build\` (the e2e globalSetup does this before the browser tests).`);
  }
  const dir = mkdtempSync(join(tmpdir(), 'longtail-e2e-'));
  const dataSource = await openDatabase(join(dir, 'longtail.sqlite'));
  const ruleSet = await loadRuleSet();
  // A 5 s digest window, so a burst's digest goes out while a test waits for the outbox; set
  // before the seed, whose own burst to the demo designer is held for a digest too.
  if (options.mail) configureNotifications({ ...notificationSettings(), digestWindowMs: DIGEST_WINDOW_E2E_MS });
  await seedDemo(dataSource, ruleSet, DEMO_PASSWORD);
  await options.prepare?.(dataSource, ruleSet);
  const serverErrors: string[] = [];
  const app = createApp({
    dataSource,
    ruleSet,
    sessionSecret: 'e2e-session-secret-not-for-production-0123456789',
    staticDir: webDist,
    log: (message) => {
      serverErrors.push(message);
      console.error(`[server] ${message}`);
    },
  });
  const server = http.createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  const baseUrl = `http://127.0.0.1:${port}`;
  let smtp: LocalSmtp | null = null;
  let outbox: OutboxWorker | null = null;
  if (options.mail) {
    // Links in the e-mails point at this server (rows the seed queued keep the default base URL).
    configureNotifications({ baseUrl, digestWindowMs: DIGEST_WINDOW_E2E_MS });
    smtp = await startLocalSmtp({ dataSource, port: 0, log: (message) => serverErrors.push(message) });
    outbox = startOutboxWorker({ dataSource, transport: createMailTransport({ localPort: smtp.port }), from: 'Longtail <longtail@demo.longtail.test>', pollMs: 100, log: (message) => serverErrors.push(message) });
  }
  return {
    baseUrl,
    dataSource,
    ruleSet,
    app,
    serverErrors,
    async close() {
      await outbox?.stop();
      await smtp?.close();
      server.closeAllConnections();
      await new Promise((resolve) => server.close(resolve));
      app.closeApp();
      await dataSource.destroy();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
