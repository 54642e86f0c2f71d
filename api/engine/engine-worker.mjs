// The entry of each engine worker thread (piscina loads this file and calls its default export
// with one task at a time). Plain JavaScript, so that a thread can start under any runner. It
// loads the tasks (engine-tasks.ts):
// - from the sources beside this file when they are there (a checkout: development, tests): imported
//   directly when the thread already understands TypeScript, else after registering tsx's loader
//   in this thread (threads started from vitest, or from tsx, whose loader does not reach them);
// - else, or when tsx is not installed, from the compiled server (scripts/build-server.mjs writes
//   dist/server/engine-tasks.js; a packed install ships no TypeScript sources).
// Nothing here but loading.
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const SOURCE = new URL('./engine-tasks.ts', import.meta.url);
const COMPILED = new URL('../../dist/server/engine-tasks.js', import.meta.url);

async function importSource() {
  try {
    return await import(SOURCE.href);
  } catch (error) {
    if (error?.code !== 'ERR_UNKNOWN_FILE_EXTENSION') throw error;
  }
  const { register } = await import('tsx/esm/api');
  register();
  // A fresh address: the failed import of SOURCE stays failed in this thread's module map
  return import(`${SOURCE.href}?loader=tsx`);
}

async function loadTasks() {
  if (!existsSync(fileURLToPath(SOURCE))) return import(COMPILED.href);
  try {
    return await importSource();
  } catch (error) {
    // No tsx (an install without devDependencies): the compiled tasks, when built
    if (error?.code === 'ERR_MODULE_NOT_FOUND' && String(error.message).includes('tsx') && existsSync(fileURLToPath(COMPILED))) return import(COMPILED.href);
    throw error;
  }
}

let tasks = null;

/** Runs one task (engine-tasks.ts, EngineTask) and answers an EngineAnswer. */
export default async function runTask(task) {
  tasks ??= loadTasks();
  const { runEngineTask } = await tasks;
  return runEngineTask(task);
}
