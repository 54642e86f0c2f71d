/**
 * The server process: configuration, database (migrated on start), mail (the outbox worker, and
 * the built-in local mail server unless a real one is configured), demo seed, listen, and a
 * graceful shutdown. The only file besides cli.ts that touches the process.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createApp } from './app';
import { loadConfig } from './config';
import { describeDatabase, openDatabase } from './data-source';
import { startLocalSmtp, type LocalSmtp } from './mail/local-smtp';
import { startOutboxWorker, type OutboxWorker } from './mail/outbox-worker';
import { createMailTransport, describeMailTarget, type MailTarget } from './mail/transport';
import { configureNotifications } from './services/notifications.service';
import { loadRuleSet } from '../rules/index';
import { DEMO_DOMAIN, seedDemo, seedFirstAdmin } from './seed/demo-seed';

const config = loadConfig();
const dataSource = await openDatabase(config.database, { poolSize: config.databasePoolSize });
const ruleSet = await loadRuleSet();

configureNotifications({ baseUrl: config.baseUrl });
let localSmtp: LocalSmtp | null = null;
let mailTarget: MailTarget | null = config.mail.smtp;
if (!mailTarget) {
  try {
    localSmtp = await startLocalSmtp({ dataSource, port: config.mail.localSmtpPort, log: console.error });
    mailTarget = { localPort: localSmtp.port };
  } catch (error) {
    console.error(
      `The local mail server could not listen on 127.0.0.1:${config.mail.localSmtpPort} (${error instanceof Error ? error.message : String(error)}): ` +
        'notifications wait in the outbox until a restart can send them (set LONGTAIL_LOCAL_SMTP_PORT, or LONGTAIL_SMTP_URL for a real server).',
    );
  }
}
let outbox: OutboxWorker | null = null;
if (mailTarget) {
  outbox = startOutboxWorker({ dataSource, transport: createMailTransport(mailTarget), from: config.mail.from, log: console.error });
  console.log(`Notifications go to ${describeMailTarget(mailTarget)}${localSmtp ? ' (admins read them on the Mail page)' : ''}`);
}
if (config.seedDemo && (await seedDemo(dataSource, ruleSet, config.demoPassword))) {
  console.log(`Seeded the demo organisation: sign in as admin|requirements|designer|reviewer|lead@${DEMO_DOMAIN}`);
}
if (config.firstAdmin && (await seedFirstAdmin(dataSource, config.firstAdmin))) console.log(`Created the first administrator, ${config.firstAdmin.email}`);

// The built browser app, found from this file (api/server.ts, or the compiled dist/server/server.js
// whose bundler keeps this file's address), so the server starts from any working directory.
const webDir = fileURLToPath(new URL('../dist/web', import.meta.url));
const staticDir = existsSync(join(webDir, 'index.html')) ? webDir : undefined;
if (!staticDir) console.log('No built browser app in dist/web (npm run build): serving the API only.');
const app = createApp({
  dataSource,
  sessionSecret: config.sessionSecret,
  ruleSet,
  trustProxy: config.trustProxy,
  staticDir,
  uploadsDir: config.uploadsDir,
  proposalsPerMinute: config.proposalsPerMinute,
  simulator: config.simulator,
  engineWorkers: config.engineWorkers,
});
const server = app.listen(config.port, () => {
  console.log(`Longtail listening on http://localhost:${config.port} (database ${describeDatabase(config.database)})`);
  // Start the SPICE engine now, in its own thread, so the first verification does not wait for it.
  app.verification.engine.start().catch((error: unknown) => console.error(`The SPICE engine did not start: ${error instanceof Error ? error.message : String(error)}`));
});

let stopping = false;
function shutdown(signal: string): void {
  if (stopping) return;
  stopping = true;
  console.log(`${signal}: closing`);
  server.close(() => {
    app.closeApp();
    Promise.all([outbox?.stop(), localSmtp?.close(), app.verification.close()])
      .catch(() => undefined)
      .then(() => dataSource.destroy())
      .finally(() => process.exit(0));
  });
  setTimeout(() => process.exit(1), 10_000).unref();
}
process.on('SIGINT', () => shutdown('SIGINT'));
process.on('SIGTERM', () => shutdown('SIGTERM'));
