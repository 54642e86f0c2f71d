/**
 * The tail-current window (shared/engine/current-window.ts): each bound against its hand formula
 * written out here from its source (DOMAIN.md, "The rest of the decision"; P. R. Gray, P. J. Hurst,
 * S. H. Lewis, R. G. Meyer, Analysis and Design of Analog Integrated Circuits, the noise and
 * slew-rate sections, cited from memory), the policy's pick inside it, and sizing that moves the
 * current into the window so the option's own solved figures meet the targets.
 */
import { describe, expect, test } from 'vitest';
import { currentWindow, pickCurrent, WINDOW_MARGIN } from '#shared/engine/current-window';
import { recommend } from '#shared/engine/index';
import type { Spec } from '#shared/engine/types';
import { validateSpec } from '#shared/validate';
import { loadRuleSet } from '../../../rules/index';

const ruleSet = await loadRuleSet();

/** k and q, exact in the SI since 2019 (CODATA); 27 °C in kelvin. */
const K = 1.380649e-23;
const Q = 1.602176634e-19;
const KELVIN = 300.15;
const VT = (K * KELVIN) / Q;

/** An invented sensor front end of Brackenmoor Controls (±12 V, differential gain 50). */
function spec(extra: Record<string, unknown> = {}): Spec {
  const checked = validateSpec({
    title: 'Brackenmoor thermopile input',
    device: { beta: 160, earlyVoltageV: 90, saturationCurrentA: 8e-15 },
    supply: { positiveV: 12, negativeV: -12 },
    gain: { target: 50, output: 'differential' },
    cmrr: { minDb: 60 },
    powerBudgetW: 0.05,
    ...extra,
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked));
  return checked.value;
}

describe('each bound against its hand formula', () => {
  test('slew rate: a switched pair moves 2·I/CL on the differential output, so I ≥ SR·CL/2', () => {
    const w = currentWindow(spec({ slewRateMinVPerS: 5e6, loadCapacitanceF: 20e-12 }), 1);
    expect(w.bounds.find((b) => b.requirement === 'slew-rate')).toMatchObject({ side: 'lower', basis: 'hand' });
    expect(w.bounds.find((b) => b.requirement === 'slew-rate')!.currentA).toBeCloseTo((5e6 * 20e-12) / 2, 15);
  });

  test('bandwidth into CL at a held gain Ad = gm·RC: 1/(2π·RC·CL) with RC = 2VT·Ad/I, so I ≥ 2π·BW·CL·2VT·Ad', () => {
    const w = currentWindow(spec({ bandwidthMinHz: 1e6, loadCapacitanceF: 10e-12 }), 1);
    const expected = 2 * Math.PI * 1e6 * 10e-12 * 2 * VT * 50;
    expect(w.bounds.find((b) => b.requirement === 'bandwidth')!.currentA / expected).toBeCloseTo(1, 9);
  });

  test('bias current: IB = I/(2β) at the lowest current gain, half the nominal when the spread is left out', () => {
    expect(currentWindow(spec({ inputBiasCurrentMaxA: 1e-6 }), 1).upper).toMatchObject({ requirement: 'input-bias-current', currentA: 2 * 80 * 1e-6 });
    expect(currentWindow(spec({ inputBiasCurrentMaxA: 1e-6, betaRange: { min: 120, max: 300 } }), 1).upper!.currentA).toBeCloseTo(2 * 120 * 1e-6, 15);
  });

  test('noise without source resistance: each half 2qIC/gm² = 2q·VT²/IC plus each load 4kT·RC through Ad, en² = (8q·VT² + 16kT·VT/Ad)/I', () => {
    const en = 4e-9;
    const w = currentWindow(spec({ noise: { maxVPerRtHz: en, atFrequencyHz: 1000 } }), 1);
    const alpha = 8 * Q * VT * VT + (16 * K * KELVIN * VT) / 50;
    expect(w.lower!.requirement).toBe('noise');
    expect(w.lower!.currentA / (alpha / (en * en))).toBeCloseTo(1, 9);
    // no base-current term without a source resistance: no ceiling from noise
    expect(w.bounds.some((b) => b.requirement === 'noise-base-current')).toBe(false);
  });

  test('noise with a source resistance: the base current’s shot noise in RS makes a ceiling, and RS’s own 8kT·RS can leave no current at all', () => {
    const w = currentWindow(spec({ noise: { maxVPerRtHz: 10e-9, atFrequencyHz: 1000 }, sourceResistanceOhm: 1000 }), 1);
    const floor = w.bounds.find((b) => b.requirement === 'noise')!.currentA;
    const ceiling = w.bounds.find((b) => b.requirement === 'noise-base-current')!.currentA;
    // both roots satisfy α/I + β0 + γI = en²
    const alpha = 8 * Q * VT * VT + (16 * K * KELVIN * VT) / 50;
    const beta0 = 8 * K * KELVIN * 1000;
    const gamma = (2 * Q * 1000 ** 2) / 160;
    for (const i of [floor, ceiling]) expect((alpha / i + beta0 + gamma * i) / 1e-16).toBeCloseTo(1, 6);
    expect(ceiling).toBeGreaterThan(floor);
    // 8kT·RS of 50 kΩ alone is about 41 nV/√Hz: no current brings the noise under 10 nV/√Hz
    const none = currentWindow(spec({ noise: { maxVPerRtHz: 10e-9, atFrequencyHz: 1000 }, sourceResistanceOhm: 50_000 }), 1);
    expect(none.lower!.currentA).toBe(Number.POSITIVE_INFINITY);
    expect(none.empty).toBe(true);
  });

  test('calibrated on the solved circuit: the hand formula scaled to the circuit’s figure at one current', () => {
    const s = spec({ slewRateMinVPerS: 5e6, loadCapacitanceF: 20e-12 });
    const w = currentWindow(s, 1, { currentA: 1e-3, slewRateVPerS: 80e6, noiseVPerRtHz: null, bandwidthHz: null, inputBiasCurrentA: null });
    expect(w.bounds.find((b) => b.requirement === 'slew-rate')).toMatchObject({ basis: 'solved', currentA: (1e-3 * 5e6) / 80e6 });
  });
});

describe('the pick inside the window', () => {
  const bound = (requirement: 'noise' | 'power-budget', side: 'lower' | 'upper', currentA: number) => ({ requirement, side, currentA, basis: 'hand' as const });
  test('the preferred current inside the window stays; below the floor it moves to the floor times the margin; above the ceiling to the ceiling over it', () => {
    const window = { bounds: [], lower: bound('noise', 'lower', 1e-4), upper: bound('power-budget', 'upper', 1e-2), empty: false };
    expect(pickCurrent(window, 1e-3)).toEqual({ currentA: 1e-3, setBy: 'preferred' });
    expect(pickCurrent(window, 1e-5)).toEqual({ currentA: 1e-4 * WINDOW_MARGIN, setBy: 'noise' });
    expect(pickCurrent(window, 1)).toEqual({ currentA: 1e-2 / WINDOW_MARGIN, setBy: 'power-budget' });
    expect(pickCurrent(window, 1e-3, 5e-4)).toEqual({ currentA: 5e-4, setBy: 'fixed' });
  });

  test('a window narrower than the margins: its geometric middle; an empty one: the ceiling', () => {
    const narrow = { bounds: [], lower: bound('noise', 'lower', 1e-3), upper: bound('power-budget', 'upper', 1.2e-3), empty: false };
    expect(pickCurrent(narrow, 1e-2).currentA).toBeCloseTo(Math.sqrt(1.2e-6), 12);
    const empty = { bounds: [], lower: bound('noise', 'lower', 2e-3), upper: bound('power-budget', 'upper', 1e-3), empty: true };
    expect(pickCurrent(empty, 1e-2)).toEqual({ currentA: 1e-3, setBy: 'power-budget' });
  });
});

describe('sizing moves the current into the window', () => {
  test('a noise limit the budget’s current misses: the option is sized at more current and its solved noise meets the limit at every corner', async () => {
    // 0.5 nV/√Hz needs about 3.6 mA (hand formula); the policy's own current stops at its 2 mA cap,
    // where the collector shot noise alone is about 0.67 nV/√Hz, and a 1 W budget leaves room above
    const s = spec({ powerBudgetW: 1, noise: { maxVPerRtHz: 0.5e-9, atFrequencyHz: 1000 }, topologies: ['simple-mirror', 'resistor'], temperatureC: { min: 20, max: 40 } });
    const result = await recommend(s, ruleSet);
    for (const option of result.options) {
      const check = option.checks.find((c) => c.rule === 'input-noise')!;
      expect(check.passed, `${option.topology}: ${check.reason}`).toBe(true);
      expect(option.sizingNotes.join(' ')).toContain('set by the noise limit');
      expect(option.figures!.tailCurrentWindowSet).toBe(true);
    }
  });

  test('a slew rate the bias-current limit forbids: the window is empty, the option fails the window check naming both', async () => {
    const s = spec({ slewRateMinVPerS: 50e6, loadCapacitanceF: 50e-12, inputBiasCurrentMaxA: 1e-6, topologies: ['simple-mirror'] });
    const [option] = (await recommend(s, ruleSet)).options;
    const check = option.checks.find((c) => c.rule === 'tail-current-window')!;
    expect(check.passed).toBe(false);
    expect(check.reason).toContain('the slew-rate target needs');
    expect(check.reason).toContain('the input bias-current limit allows');
    expect(option.passes).toBe(false);
  });
});
