// The entry of each engine worker thread (piscina loads this file and calls its default export
// with one task at a time). Plain JavaScript, so that a thread can start under any runner:
// - beside a compiled engine-tasks.js (a built server), that file is loaded;
// - else engine-tasks.ts is imported: directly when the thread already understands TypeScript
//   (a server started with tsx passes its loader on to its threads), otherwise (a thread started
//   from vitest, or from plain node) after registering tsx's loader in this thread.
// Nothing here but loading: the tasks are in engine-tasks.ts.
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

async function loadTasks() {
  const compiled = new URL('./engine-tasks.js', import.meta.url);
  if (existsSync(fileURLToPath(compiled))) return import(compiled.href);
  const source = new URL('./engine-tasks.ts', import.meta.url).href;
  try {
    return await import(source);
  } catch (error) {
    if (error?.code !== 'ERR_UNKNOWN_FILE_EXTENSION') throw error;
    const { register } = await import('tsx/esm/api');
    register();
    // A fresh address: the failed import of `source` stays failed in this thread's module map
    return import(`${source}?loader=tsx`);
  }
}

let tasks = null;

/** Runs one task (engine-tasks.ts, EngineTask) and answers an EngineAnswer. */
export default async function runTask(task) {
  tasks ??= loadTasks();
  const { runEngineTask } = await tasks;
  return runEngineTask(task);
}
