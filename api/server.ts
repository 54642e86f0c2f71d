/**
 * The server process: configuration, database (migrated on start), demo seed, listen, and a
 * graceful shutdown. The only file besides cli.ts that touches the process.
 */
import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { createApp } from './app';
import { loadConfig } from './config';
import { openDatabase } from './data-source';
import { loadRuleSet } from '../rules/index';
import { DEMO_DOMAIN, seedDemo, seedFirstAdmin } from './seed/demo-seed';

const config = loadConfig();
const dataSource = await openDatabase(config.databasePath);
const ruleSet = await loadRuleSet();
if (config.seedDemo && (await seedDemo(dataSource, ruleSet, config.demoPassword))) {
  console.log(`Seeded the demo organisation: sign in as admin|requirements|designer|reviewer@${DEMO_DOMAIN}`);
}
if (config.firstAdmin && (await seedFirstAdmin(dataSource, config.firstAdmin))) console.log(`Created the first administrator, ${config.firstAdmin.email}`);

const webDir = resolve('dist/web');
const staticDir = existsSync(join(webDir, 'index.html')) ? webDir : undefined;
if (!staticDir) console.log('No built browser app in dist/web (npm run build): serving the API only.');
const app = createApp({ dataSource, sessionSecret: config.sessionSecret, ruleSet, trustProxy: config.trustProxy, staticDir });
const server = app.listen(config.port, () => {
  console.log(`Longtail listening on http://localhost:${config.port} (database ${config.databasePath})`);
});

let stopping = false;
function shutdown(signal: string): void {
  if (stopping) return;
  stopping = true;
  console.log(`${signal}: closing`);
  server.close(() => {
    app.closeApp();
    dataSource.destroy().finally(() => process.exit(0));
  });
  setTimeout(() => process.exit(1), 10_000).unref();
}
process.on('SIGINT', () => shutdown('SIGINT'));
process.on('SIGTERM', () => shutdown('SIGTERM'));
