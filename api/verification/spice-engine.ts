/**
 * The server's SPICE engine: one ngspice (eecircuit-engine) in a worker thread, started on first
 * use and reused for every run after. Runs are serialised (one at a time, in the order asked), so
 * concurrent jobs never share the simulator mid-run. Each run has a time limit; a run past it
 * ends the worker thread (the only way to stop WebAssembly mid-computation) and the next run
 * starts a fresh one.
 *
 * Recycling: ngspice keeps about 40 kB of every circuit it loaded inside its WebAssembly heap,
 * which never shrinks (measured: +165 MB over a 2,000-run Monte Carlo, 4,000 analyses; the
 * process grew by 360 MB). So the thread is ended after `recycleAfterRuns` runs or once its heap
 * passes `recycleAboveHeapBytes`, between two runs, and the next run starts a fresh one (about
 * 0.3 s). Both bounds are options of the constructor; the defaults are below.
 */
import { Worker } from 'node:worker_threads';
import type { ResultType } from 'eecircuit-engine';
import { plotName, type SpiceRunner } from './spice-analyses';

/** Time limit for one analysis unless the caller gives another, ms. */
export const DEFAULT_ANALYSIS_TIME_LIMIT_MS = 20_000;

/**
 * A fresh thread after this many runs: about 100 MB of leaked heap at 40 kB a run, and one start
 * (≈ 0.3 s) per ≈ 8 s of Monte Carlo, under 4 % of the simulator's time.
 */
export const DEFAULT_RECYCLE_AFTER_RUNS = 2500;
/** A fresh thread once the WebAssembly heap passes this (it starts near 17 MB), bytes. */
export const DEFAULT_RECYCLE_ABOVE_HEAP_BYTES = 160 * 2 ** 20;

export interface SpiceEngineOptions {
  /** Runs on one thread before it is replaced (default `DEFAULT_RECYCLE_AFTER_RUNS`). */
  recycleAfterRuns?: number;
  /** Heap size past which the thread is replaced after its current run, bytes (default `DEFAULT_RECYCLE_ABOVE_HEAP_BYTES`). */
  recycleAboveHeapBytes?: number;
}

/** A run that failed inside ngspice, ran out of time, or lost its thread. The message is for people. */
export class SpiceRunError extends Error {
  constructor(
    message: string,
    readonly kind: 'simulation' | 'time-limit' | 'engine',
  ) {
    super(message);
    this.name = 'SpiceRunError';
  }
}

interface WorkerReply {
  id: number;
  ok: boolean;
  ready?: boolean;
  info?: string;
  result?: ResultType;
  errors?: string[];
  /** The thread's WebAssembly heap after the run, bytes (null when it could not be read). */
  heapBytes?: number | null;
}

interface Started {
  worker: Worker;
  version: string;
  /** Runs sent to this worker and not answered yet. */
  pending: Map<number, { resolve: (reply: WorkerReply) => void; reject: (error: Error) => void }>;
  /** Runs answered by this thread. */
  runs: number;
}

/** ngspice's own messages, without the start-up noise about a missing init file. */
function usefulErrors(errors: string[]): string[] {
  return errors.map((e) => e.trim()).filter((e) => e.length > 0 && !/spinit/i.test(e));
}

export class SpiceEngine {
  private started: Promise<Started> | null = null;
  private queue: Promise<unknown> = Promise.resolve();
  private nextId = 1;
  private shutDown = false;
  /** ms spent by the last start (0 until one happened). */
  lastStartMs = 0;
  /** How many times a worker was started (restarts after a time limit or a recycling included). */
  starts = 0;
  /** How many times a thread was ended for its run count or heap size. */
  recycles = 0;
  /** The current thread's WebAssembly heap after its last run, bytes (null before one, or unknown). */
  heapBytes: number | null = null;
  readonly recycleAfterRuns: number;
  readonly recycleAboveHeapBytes: number;

  constructor(
    private readonly timeLimitMs = DEFAULT_ANALYSIS_TIME_LIMIT_MS,
    options: SpiceEngineOptions = {},
  ) {
    this.recycleAfterRuns = options.recycleAfterRuns ?? DEFAULT_RECYCLE_AFTER_RUNS;
    this.recycleAboveHeapBytes = options.recycleAboveHeapBytes ?? DEFAULT_RECYCLE_ABOVE_HEAP_BYTES;
  }

  /** Starts the simulator if it is not running; resolves with the ms this call spent starting it (0 if it was up). */
  async start(): Promise<number> {
    if (this.started) {
      await this.started;
      return 0;
    }
    const t0 = performance.now();
    await this.ensureStarted();
    return performance.now() - t0;
  }

  /** ngspice's version line, e.g. "ngspice-45.2" (starts the engine if needed). */
  async version(): Promise<string> {
    return (await this.ensureStarted()).version;
  }

  private ensureStarted(): Promise<Started> {
    if (this.shutDown) return Promise.reject(new SpiceRunError('The simulator has been shut down.', 'engine'));
    if (this.started) return this.started;
    const t0 = performance.now();
    const pending: Started['pending'] = new Map();
    const failAll = (error: Error) => {
      for (const waiting of pending.values()) waiting.reject(error);
      pending.clear();
    };
    const promise: Promise<Started> = new Promise<Started>((resolve, reject) => {
      // ngspice prints its messages too; they come back with each run, so the thread's own output is dropped.
      const worker = new Worker(new URL('./spice-worker.mjs', import.meta.url), { stdout: true, stderr: true });
      worker.stdout.resume();
      worker.stderr.resume();
      worker.unref();
      const onReady = (reply: WorkerReply) => {
        if (reply.id !== 0) return;
        worker.off('message', onReady);
        if (!reply.ok) {
          reject(new SpiceRunError(`The simulator did not start: ${(reply.errors ?? []).join('; ')}`, 'engine'));
          void worker.terminate();
          return;
        }
        this.lastStartMs = performance.now() - t0;
        this.starts += 1;
        worker.on('message', (message: WorkerReply) => {
          const waiting = pending.get(message.id);
          if (!waiting) return;
          pending.delete(message.id);
          waiting.resolve(message);
        });
        this.heapBytes = reply.heapBytes ?? null;
        resolve({ worker, version: /ngspice-[\d.]+/.exec(reply.info ?? '')?.[0] ?? 'ngspice', pending, runs: 0 });
      };
      worker.on('message', onReady);
      worker.on('error', (error) => {
        failAll(new SpiceRunError(`The simulator stopped: ${error.message}`, 'engine'));
        reject(error);
      });
      worker.on('exit', () => {
        failAll(new SpiceRunError('The simulator stopped unexpectedly.', 'engine'));
        reject(new SpiceRunError('The simulator stopped before it started.', 'engine'));
        if (this.started === promise) this.started = null;
      });
    });
    promise.catch(() => {
      if (this.started === promise) this.started = null;
    });
    this.started = promise;
    return promise;
  }

  /**
   * Runs one netlist, after every run asked for before it. Rejects with a `SpiceRunError` when
   * ngspice reports errors, returns no data or another plot than `expectedPlot`, or the run
   * passes the time limit.
   */
  run(netlist: string, expectedPlot?: string, timeLimitMs = this.timeLimitMs): Promise<ResultType> {
    const run = this.queue.then(() => this.runNow(netlist, expectedPlot, timeLimitMs));
    this.queue = run.catch(() => undefined);
    return run;
  }

  /** `run` as a `SpiceRunner`, for the measurement functions. */
  readonly runner: SpiceRunner = (netlist, expectedPlot) => this.run(netlist, expectedPlot);

  private async runNow(netlist: string, expectedPlot: string | undefined, timeLimitMs: number): Promise<ResultType> {
    const started = this.ensureStarted();
    const thread = await started;
    const { worker, pending } = thread;
    const id = this.nextId++;
    let timer: NodeJS.Timeout | undefined;
    const reply = await new Promise<WorkerReply>((resolve, reject) => {
      pending.set(id, { resolve, reject });
      timer = setTimeout(() => {
        pending.delete(id);
        if (this.started === started) this.started = null;
        void worker.terminate();
        reject(new SpiceRunError(`The analysis passed its time limit of ${(timeLimitMs / 1000).toFixed(1)} s and was stopped.`, 'time-limit'));
      }, timeLimitMs);
      worker.postMessage({ id, netlist });
    }).finally(() => clearTimeout(timer));
    thread.runs += 1;
    this.heapBytes = reply.heapBytes ?? null;
    // Runs are serialised, so nothing else is on this thread now: replace it before the next run.
    if (thread.runs >= this.recycleAfterRuns || (this.heapBytes !== null && this.heapBytes > this.recycleAboveHeapBytes)) this.recycle(started);
    const errors = usefulErrors(reply.errors ?? []);
    const result = reply.result;
    if (!reply.ok || !result) throw new SpiceRunError(`ngspice failed: ${errors.join('; ') || 'no result'}`, 'simulation');
    const plot = plotName(result);
    if (errors.length > 0 || result.numVariables === 0 || (expectedPlot !== undefined && plot !== expectedPlot)) {
      const why = errors.length > 0 ? errors.join('; ') : `it returned the plot "${plot}" instead of "${expectedPlot}"`;
      throw new SpiceRunError(`ngspice could not run the analysis: ${why}`, 'simulation');
    }
    return result;
  }

  /** Ends a thread between runs; the next run starts a fresh one. */
  private recycle(started: Promise<Started>): void {
    if (this.started !== started) return;
    this.started = null;
    this.recycles += 1;
    void started.then(({ worker }) => worker.terminate()).catch(() => undefined);
  }

  /** Ends the worker thread for good (shutdown); later runs are refused. */
  async stop(): Promise<void> {
    this.shutDown = true;
    const started = this.started;
    this.started = null;
    if (!started) return;
    try {
      const { worker } = await started;
      await worker.terminate();
    } catch {
      // never started: nothing to stop
    }
  }
}
