/**
 * ngspice as the tests' reference simulator. Two builds can answer:
 * - the registry's (eecircuit-engine, WebAssembly), in process: one long-lived `Simulation`,
 *   started lazily on first use (about a second) and reused; runs go through a promise queue, so
 *   concurrent callers never share it mid-run. The default.
 * - Debian's (/usr/bin/ngspice, tests/helpers/debian-ngspice.ts), one batch process per run, when
 *   the test process's LONGTAIL_TEST_SPICE is `debian`: vitest.config.ts sets it in the
 *   `reference-debian-ngspice` project, which runs the reference files again
 *   (tests/helpers/debian-ngspice-project.ts lists them).
 * Only "run this netlist, return its vectors" differs between them: the measurements are the
 * product's (`api/verification/spice-analyses.ts`), so tests and verification jobs read ngspice
 * the same way; every netlist comes from the product's writer, `spiceNetlist`.
 */
import { Simulation, type ResultType } from 'eecircuit-engine';
import { runDebianNgspice } from './debian-ngspice';
import { spiceNetlist, type NetlistSolverSettings, type TransistorVector } from '#shared/engine/netlist';
import type { Design } from '#shared/engine/types';
import {
  PLOT_NAMES,
  REFERENCE_RELATIVE_TOLERANCE,
  plotName,
  spiceAc as spiceAcWith,
  spiceFigures as spiceFiguresWith,
  spiceOperatingPoint as spiceOperatingPointWith,
  type AcOptions,
  type SpiceAc,
  type SpiceFigures,
  type SpiceOperatingPoint,
} from '../../api/verification/spice-analyses';

export {
  CORNER_SWEEP,
  LOW_FREQUENCY_HZ,
  MATCHED_PAIR_RATIO,
  MAX_IMAGINARY_FRACTION,
  REFERENCE_RELATIVE_TOLERANCE,
  complexMagnitude,
  dropFrequencyHz,
  singleFrequencySweep,
  type AcOptions,
  type Complex,
  type SpiceAc,
  type SpiceFigures,
  type SpiceOperatingPoint,
  type SpiceTransistorBias,
} from '../../api/verification/spice-analyses';

/** Which build answers in this test process: `debian` (Debian's /usr/bin/ngspice) or `registry` (eecircuit-engine). */
export const REFERENCE_SPICE_BUILD: 'debian' | 'registry' = process.env.LONGTAIL_TEST_SPICE === 'debian' ? 'debian' : 'registry';

let simulation: Promise<Simulation> | null = null;
let queue: Promise<unknown> = Promise.resolve();

function startedSimulation(): Promise<Simulation> {
  if (!simulation) {
    simulation = (async () => {
      const sim = new Simulation();
      await sim.start();
      return sim;
    })();
  }
  return simulation;
}

/** Starts the shared simulator (about a second the first time; nothing to start for Debian's build); later calls return at once. */
export async function startSpice(): Promise<void> {
  if (REFERENCE_SPICE_BUILD === 'registry') await startedSimulation();
}

/**
 * Runs one netlist on this process's build (REFERENCE_SPICE_BUILD) and returns ngspice's raw
 * result. Throws with ngspice's messages when the run fails or returns another plot than
 * `expectedPlot`.
 */
export function runSpice(netlist: string, expectedPlot?: string): Promise<ResultType> {
  return REFERENCE_SPICE_BUILD === 'debian' ? runDebianNgspice(netlist, expectedPlot) : runRegistrySpice(netlist, expectedPlot);
}

/** Runs one netlist on the registry's build, serialised with every other run. */
function runRegistrySpice(netlist: string, expectedPlot?: string): Promise<ResultType> {
  const run = queue.then(async () => {
    const sim = await startedSimulation();
    sim.setNetList(netlist);
    const result = await sim.runSim();
    const errors = [...sim.getError()];
    const plot = plotName(result);
    if (errors.length > 0 || result.numVariables === 0 || (expectedPlot !== undefined && plot !== expectedPlot)) {
      throw new Error(`ngspice run failed (plot "${plot}"):\n${errors.join('\n')}\n--- netlist ---\n${netlist}`);
    }
    return result;
  });
  queue = run.catch(() => undefined);
  return run;
}

/** Runs `.op` on a design's netlist (reference RELTOL unless `solver` says otherwise). */
export function spiceOperatingPoint(design: Design, solver?: NetlistSolverSettings): Promise<SpiceOperatingPoint> {
  return spiceOperatingPointWith(runSpice, design, solver);
}

/** Runs one AC analysis (differential, common-mode or tail drive) on a design's netlist. */
export function spiceAc(design: Design, options: AcOptions): Promise<SpiceAc> {
  return spiceAcWith(runSpice, design, options);
}

/** The contract's figures measured by simulation (see the product module for how). */
export function spiceFigures(design: Design, options: { frequencyHz?: number } = {}): Promise<SpiceFigures> {
  return spiceFiguresWith(runSpice, design, options);
}

/** ngspice's own figures of each transistor at the operating point, by transistor name (upper case) then vector. */
export type SpiceTransistorVectors = Record<string, Partial<Record<TransistorVector, number>>>;

/**
 * Runs `.op` with `.save all @q…[vector]` for every transistor (reference RELTOL) and returns
 * ngspice's device figures: `@q1[gm]` etc. as ngspice names them (`i(@q1[ic])` for currents).
 */
export async function spiceTransistorVectors(design: Design, vectors: readonly TransistorVector[]): Promise<SpiceTransistorVectors> {
  const netlist = spiceNetlist(design, { analysis: 'op', transistorVectors: vectors, relativeTolerance: REFERENCE_RELATIVE_TOLERANCE });
  const result = await runSpice(netlist, PLOT_NAMES.op);
  const figures: SpiceTransistorVectors = {};
  for (const d of result.data) {
    const match = /^(?:i\()?@(q[a-z0-9]*)\[([a-z]+)\]\)?$/i.exec(d.name);
    if (!match) continue;
    const name = match[1].toUpperCase();
    figures[name] = { ...figures[name], [match[2].toLowerCase()]: (d.values as number[])[0] };
  }
  return figures;
}
