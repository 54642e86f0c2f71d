// The SPICE engine's thread: one ngspice (eecircuit-engine, WebAssembly) started once and reused.
// ngspice runs synchronously inside WebAssembly, so it lives in a worker thread: the server's
// event loop stays free while it computes, and a run past its time limit is ended by terminating
// this thread (the main side then starts a fresh one). Plain JavaScript so it loads under any
// TypeScript runner. Messages in: { id, netlist }. Messages out: { id, ok, result?, errors?, heapBytes }.
//
// ngspice keeps some memory of every circuit it has loaded (about 40 kB a run, measured), and a
// WebAssembly heap only grows, so each reply carries the heap's size: the main side ends this
// thread and starts a fresh one past a bound (spice-engine.ts, recycling).
import { parentPort } from 'node:worker_threads';

/**
 * Every WebAssembly memory this thread creates, caught as it is instantiated: ngspice's, and small
 * ones such as the HTTP parser's that loading the module through fetch brings; the largest is ngspice's.
 */
const memories = new Set();
const catchMemory = (instantiate) =>
  async function (...args) {
    const made = await instantiate.apply(WebAssembly, args);
    const exported = (made.instance ?? made).exports?.memory;
    if (exported instanceof WebAssembly.Memory) memories.add(exported);
    return made;
  };
WebAssembly.instantiate = catchMemory(WebAssembly.instantiate);
if (WebAssembly.instantiateStreaming) WebAssembly.instantiateStreaming = catchMemory(WebAssembly.instantiateStreaming);
const heapBytes = () => (memories.size === 0 ? null : Math.max(...[...memories].map((m) => m.buffer.byteLength)));

const { Simulation } = await import('eecircuit-engine');
const simulation = new Simulation();
const started = simulation.start().then(
  () => parentPort.postMessage({ id: 0, ok: true, ready: true, info: simulation.getInitInfo(), heapBytes: heapBytes() }),
  (error) => parentPort.postMessage({ id: 0, ok: false, ready: true, errors: [String(error?.message ?? error)] }),
);

parentPort.on('message', async ({ id, netlist }) => {
  await started;
  try {
    simulation.setNetList(netlist);
    const result = await simulation.runSim();
    const errors = [...simulation.getError()];
    parentPort.postMessage({ id, ok: true, result, errors, heapBytes: heapBytes() });
  } catch (error) {
    parentPort.postMessage({ id, ok: false, errors: [String(error?.message ?? error)], heapBytes: heapBytes() });
  }
});
