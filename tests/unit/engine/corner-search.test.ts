/**
 * The corner searches of `analyze` (shared/engine/analyze.ts: cornersHz, refinedCornerHz,
 * refineCrossing): the differential bandwidth and the single-ended rejection corner are the
 * lowest frequencies where each figure has fallen 3 dB (10·log10 2 dB) below its low-frequency
 * value (the contract). Each is checked against the same crossing found another way: the
 * figure read from the stage's transfers on a fine logarithmic grid (40 points a decade), then
 * bisected to 1e-12 of the frequency.
 */
import { describe, expect, test } from 'vitest';
import { solveStage, transfersAt, type StageSolution } from '#shared/engine/analyze';
import { magnitude, type StageTransfers } from '#shared/engine/small-signal';
import { TOPOLOGIES, type Design, type TailDesign, type TopologyId } from '#shared/engine/types';

const HALF_POWER_DB = 10 * Math.log10(2);
/**
 * How close the search lands: it promises 1e-6 (CORNER_RELATIVE_TOLERANCE) and stops once an
 * interpolation step is under 1e-4 of f², which on these smooth figures leaves under 1e-9; held
 * at 1e-7, so a search that stops early or steps wrongly shows.
 */
const SEARCH_TOLERANCE = 1e-7;

const TAILS: Record<TopologyId, TailDesign> = {
  resistor: { topology: 'resistor', resistanceOhm: 12000 },
  'simple-mirror': { topology: 'simple-mirror', referenceResistanceOhm: 24000 },
  'degenerated-mirror': { topology: 'degenerated-mirror', referenceResistanceOhm: 22000, emitterResistanceOhm: 1200 },
  widlar: { topology: 'widlar', referenceResistanceOhm: 5600, emitterResistanceOhm: 430 },
  wilson: { topology: 'wilson', referenceResistanceOhm: 22000 },
  cascode: { topology: 'cascode', referenceResistanceOhm: 22000 },
  ptat: { topology: 'ptat', emitterResistanceOhm: 240, startupResistanceOhm: 1.5e6, areaRatio: 8 },
};
/** An invented card with capacitances, transit time and ohmic resistances (values plausible for a small-signal NPN). */
const CARD = { IS: 2e-14, BF: 160, VAF: 75, RB: 120, RE: 0.8, RC: 20, CJE: 8e-12, CJC: 3e-12, CJS: 2.5e-12, MJS: 0.4, TF: 0.35e-9, TR: 40e-9 };

/** An invented PNP card for the PTAT tail's mirror, with its own capacitances. */
const PNP_CARD = { IS: 1e-14, BF: 90, VAF: 50, RB: 150, CJE: 6e-12, CJC: 4e-12, CJS: 3e-12, TF: 0.8e-9, TR: 60e-9 };

function designWith(topology: TopologyId, overrides: Partial<Design> = {}): Design {
  return {
    device: { family: 'npn', beta: 160, earlyVoltageV: 75, saturationCurrentA: 2e-14, model: CARD, pnp: { model: PNP_CARD } },
    supply: { positiveV: 12, negativeV: -12 },
    collectorResistanceOhm: 10000,
    tail: TAILS[topology],
    inputCommonModeV: 0,
    sourceResistanceOhm: 300,
    loadCapacitanceF: 4e-12,
    ...overrides,
  };
}

type Figure = (t: StageTransfers) => number;
const differentialGainDb: Figure = (t) => 20 * Math.log10(magnitude(t.differentialGain));
const singleEndedCmrrDb: Figure = (t) => 20 * Math.log10(magnitude(t.singleEndedGain) / magnitude(t.commonModeGain));

/** The first frequency where the figure is 3 dB below its value at 0 Hz, from 1e-4 Hz to 10 GHz, or null. */
function crossingHz(solution: StageSolution, figure: Figure): number | null {
  const target = figure(transfersAt(solution, 0)) - HALF_POWER_DB;
  const below = (f: number) => figure(transfersAt(solution, f)) - target <= 0;
  let previous = 1e-4;
  if (below(previous)) return previous;
  for (let i = 1; i <= 14 * 40; i += 1) {
    const f = 1e-4 * 10 ** (i / 40);
    if (below(f)) {
      let low = previous;
      let high = f;
      while (high - low > 1e-12 * high) {
        const mid = Math.sqrt(low * high);
        if (below(mid)) high = mid;
        else low = mid;
      }
      return high;
    }
    previous = f;
  }
  return null;
}

const relative = (a: number, b: number) => Math.abs(a / b - 1);

describe('the corner searches find the first 3 dB crossing, to 1e-7 of the frequency', () => {
  test.each([...TOPOLOGIES])('%s, full card, source and load: the differential bandwidth and the rejection corner', (topology) => {
    const solution = solveStage(designWith(topology));
    const bandwidth = crossingHz(solution, differentialGainDb);
    const corner = crossingHz(solution, singleEndedCmrrDb);
    expect(bandwidth).not.toBeNull();
    expect(corner).not.toBeNull();
    expect(relative(solution.result.differentialBandwidthHz!, bandwidth!)).toBeLessThan(SEARCH_TOLERANCE);
    expect(relative(solution.result.cmrrCornerHz!, corner!)).toBeLessThan(SEARCH_TOLERANCE);
  });

  test.each([...TOPOLOGIES])('%s, three-parameter device with 22 pF on the tail only: the rejection corner (the gain never falls)', (topology) => {
    const design = designWith(topology, { device: { family: 'npn', beta: 160, earlyVoltageV: 75, saturationCurrentA: 2e-14, pnp: { beta: 90, earlyVoltageV: 50, saturationCurrentA: 1e-14 } }, sourceResistanceOhm: 0, loadCapacitanceF: 0, tailCapacitanceF: 22e-12 });
    const solution = solveStage(design);
    expect(solution.result.differentialBandwidthHz).toBeNull();
    expect(crossingHz(solution, differentialGainDb)).toBeNull();
    expect(relative(solution.result.cmrrCornerHz!, crossingHz(solution, singleEndedCmrrDb)!)).toBeLessThan(SEARCH_TOLERANCE);
  });

  test('a corner below the search\'s lowest frequency (1 mF on a cascode tail): reported at 1e-4 Hz, where the figure is already 3 dB down', () => {
    const solution = solveStage(designWith('cascode', { device: { family: 'npn', beta: 160, earlyVoltageV: 75, saturationCurrentA: 2e-14 }, sourceResistanceOhm: 0, loadCapacitanceF: 0, tailCapacitanceF: 1e-3 }));
    expect(crossingHz(solution, singleEndedCmrrDb)).toBe(1e-4);
    expect(relative(solution.result.cmrrCornerHz!, 1e-4)).toBeLessThan(1e-12);
  });
});
