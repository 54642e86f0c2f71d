/**
 * The server's SPICE engine: one ngspice (eecircuit-engine) in a worker thread, started on first
 * use and reused for every run after. Runs are serialised (one at a time, in the order asked), so
 * concurrent jobs never share the simulator mid-run. Each run has a time limit; a run past it
 * ends the worker thread (the only way to stop WebAssembly mid-computation) and the next run
 * starts a fresh one.
 */
import { Worker } from 'node:worker_threads';
import type { ResultType } from 'eecircuit-engine';
import { plotName, type SpiceRunner } from './spice-analyses';

/** Time limit for one analysis unless the caller gives another, ms. */
export const DEFAULT_ANALYSIS_TIME_LIMIT_MS = 20_000;

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
}

interface Started {
  worker: Worker;
  version: string;
  /** Runs sent to this worker and not answered yet. */
  pending: Map<number, { resolve: (reply: WorkerReply) => void; reject: (error: Error) => void }>;
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
  /** How many times a worker was started (restarts after a time limit included). */
  starts = 0;

  constructor(private readonly timeLimitMs = DEFAULT_ANALYSIS_TIME_LIMIT_MS) {}

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
        resolve({ worker, version: /ngspice-[\d.]+/.exec(reply.info ?? '')?.[0] ?? 'ngspice', pending });
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
    const { worker, pending } = await started;
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
