// The SPICE engine's thread: one ngspice (eecircuit-engine, WebAssembly) started once and reused.
// ngspice runs synchronously inside WebAssembly, so it lives in a worker thread: the server's
// event loop stays free while it computes, and a run past its time limit is ended by terminating
// this thread (the main side then starts a fresh one). Plain JavaScript so it loads under any
// TypeScript runner. Messages in: { id, netlist }. Messages out: { id, ok, result?, errors?, plot? }.
import { parentPort } from 'node:worker_threads';
import { Simulation } from 'eecircuit-engine';

const simulation = new Simulation();
const started = simulation.start().then(
  () => parentPort.postMessage({ id: 0, ok: true, ready: true, info: simulation.getInitInfo() }),
  (error) => parentPort.postMessage({ id: 0, ok: false, ready: true, errors: [String(error?.message ?? error)] }),
);

parentPort.on('message', async ({ id, netlist }) => {
  await started;
  try {
    simulation.setNetList(netlist);
    const result = await simulation.runSim();
    const errors = [...simulation.getError()];
    parentPort.postMessage({ id, ok: true, result, errors });
  } catch (error) {
    parentPort.postMessage({ id, ok: false, errors: [String(error?.message ?? error)] });
  }
});
