/**
 * What limits the rejection (shared/engine/rejection-limits.ts): the figures held to their
 * definitions and to the design's own inputs. A part's share is 100·S/ΣS over the parts with
 * S > 0 (so the limits add up to 100 % and come largest first); an offsetting part has S < 0, a
 * capacitance, a negative share on the same scale, most negative first, and is never the pair's
 * own conductances; an element is shown with the value the design gave it (the load resistors'
 * ohms, the capacitors' farads). A tail with nothing that stores charge is a plain resistance:
 * |Z| = R at every frequency. Every value is invented; each test solves its own design.
 */
import { describe, expect, test } from 'vitest';
import { solveStage } from '#shared/engine/analyze';
import type { BjtModelCard } from '#shared/engine/bjt-parameters';
import { rejectionLimits, tailImpedanceOhm } from '#shared/engine/rejection-limits';
import type { Design } from '#shared/engine/types';

const CARD: BjtModelCard = { IS: 1.4e-14, BF: 210, VAF: 62, RB: 120, CJE: 12e-12, VJE: 0.72, MJE: 0.36, CJC: 4.5e-12, VJC: 0.6, MJC: 0.42, CJS: 2.2e-12, VJS: 0.65, MJS: 0.4, TF: 0.45e-9 };
const LOAD_OHM = 10000;
const LOAD_F = 5e-12;
const WIRING_F = 2e-12;

/** A simple-mirror stage with a full card, load and wiring capacitances, and a source resistance. */
function mirrorStage(): Design {
  return {
    device: { family: 'npn', beta: 210, earlyVoltageV: 62, saturationCurrentA: 1.4e-14, model: CARD },
    supply: { positiveV: 12, negativeV: -12 },
    collectorResistanceOhm: LOAD_OHM,
    tail: { topology: 'simple-mirror', referenceResistanceOhm: 22000 },
    loadCapacitanceF: LOAD_F,
    tailCapacitanceF: WIRING_F,
    sourceResistanceOhm: 1000,
  } as Design;
}

const relativeError = (a: number, b: number) => Math.abs(a / b - 1);

describe('shares, order and offsetting parts by their definitions', () => {
  test.each([1e5, 1e6, 1e7])('at %s Hz: limits 100·S/ΣS largest first, offsetting parts S < 0 on the same scale most negative first', (frequencyHz) => {
    const result = rejectionLimits(solveStage(mirrorStage()), frequencyHz, 'single-ended', 'nominal');
    const total = result.limits.reduce((sum, l) => sum + l.sensitivity, 0);
    expect(result.limits.length).toBeGreaterThan(1);
    for (const l of result.limits) {
      expect(l.sensitivity).toBeGreaterThan(0);
      expect(relativeError(l.sharePercent, (100 * l.sensitivity) / total)).toBeLessThan(1e-12);
      expect(l.elements.length).toBeGreaterThan(0);
    }
    result.limits.slice(1).forEach((l, i) => expect(l.sharePercent).toBeLessThanOrEqual(result.limits[i].sharePercent));
    expect(result.offsetting.length).toBeGreaterThan(0);
    for (const o of result.offsetting) {
      expect(o.part).not.toBe('pair');
      expect(o.sensitivity).toBeLessThan(0);
      expect(relativeError(o.sharePercent, (100 * o.sensitivity) / total)).toBeLessThan(1e-12);
      // a capacitive part: the rejection without its capacitances is given
      expect(typeof o.rejectionWithoutDb).toBe('number');
    }
    result.offsetting.slice(1).forEach((o, i) => expect(o.sharePercent).toBeGreaterThanOrEqual(result.offsetting[i].sharePercent));
    // no part is both
    const limiting = new Set(result.limits.map((l) => l.part));
    for (const o of result.offsetting) expect(limiting.has(o.part)).toBe(false);
  });

  test('at 10 MHz the three largest offsetting parts are well apart, so their order is the order of S', () => {
    const result = rejectionLimits(solveStage(mirrorStage()), 1e7, 'single-ended', 'nominal');
    const sensitivities = result.offsetting.map((o) => o.sensitivity);
    expect(sensitivities).toEqual([...sensitivities].sort((a, b) => a - b));
    const shares = result.limits.map((l) => l.sensitivity);
    expect(shares).toEqual([...shares].sort((a, b) => b - a));
  });
});

describe('elements shown with the design’s values', () => {
  test.each([1e6, 1e7])('at %s Hz the load is shown as RC1/RC2 of 10 kΩ or CL1/CL2 of 5 pF, the wiring as CT of 2 pF, the tail transistors by name', (frequencyHz) => {
    const result = rejectionLimits(solveStage(mirrorStage()), frequencyHz, 'single-ended', 'nominal');
    const parts = [...result.limits, ...result.offsetting];
    const load = parts.find((p) => p.part === 'load');
    expect(load).toBeDefined();
    expect(load!.elements.length).toBeGreaterThan(0);
    for (const e of load!.elements) {
      if (e.name === 'RC1' || e.name === 'RC2') expect(relativeError(e.resistanceOhm!, LOAD_OHM)).toBeLessThan(1e-12);
      else if (e.name === 'CL1' || e.name === 'CL2') expect(e.capacitanceF).toBe(LOAD_F);
      else throw new Error(`unexpected load element ${e.name}`);
    }
    expect(parts.find((p) => p.part === 'tail-wiring')!.elements).toEqual([{ name: 'CT', capacitanceF: WIRING_F }]);
    // the simple mirror: Q3 the reference, Q4 the output; a tail capacitance is a transistor's, with its farads
    for (const part of ['tail-base-collector', 'tail-collector-substrate'] as const) {
      const found = parts.find((p) => p.part === part);
      if (!found) continue;
      for (const e of found.elements) {
        expect(['Q3', 'Q4']).toContain(e.name);
        expect(e.capacitanceF).toBeGreaterThan(0);
        expect(e.capacitanceF).toBeLessThan(CARD.CJC! + CARD.CJS!);
      }
    }
    // the pair's capacitances are Q1's and Q2's
    for (const p of parts.filter((x) => x.part.startsWith('pair-'))) for (const e of p.elements) expect(['Q1', 'Q2']).toContain(e.name);
  });
});

describe('a tail with nothing that stores charge', () => {
  test('a resistor tail, a three-parameter device and no wiring capacitance: |Z| = R at every frequency', () => {
    const design = {
      device: { family: 'npn', beta: 150, earlyVoltageV: 0, saturationCurrentA: 1e-14 },
      supply: { positiveV: 12, negativeV: -12 },
      collectorResistanceOhm: 10000,
      tail: { topology: 'resistor', resistanceOhm: 22000 },
    } as Design;
    const solved = solveStage(design);
    for (const f of [0, 1e3, 1e9]) expect(relativeError(tailImpedanceOhm(solved, f), 22000)).toBeLessThan(1e-12);
  });

  test('a resistor tail with a wiring capacitance and a card whose devices store charge: the tail is still R ∥ C alone, the pair’s charges not counted', () => {
    // R/√(1 + (ωRC)²) at ωRC = 2
    const design = {
      device: { family: 'npn', beta: 210, earlyVoltageV: 62, saturationCurrentA: 1.4e-14, model: CARD },
      supply: { positiveV: 12, negativeV: -12 },
      collectorResistanceOhm: 10000,
      tail: { topology: 'resistor', resistanceOhm: 22000 },
      tailCapacitanceF: 10e-12,
    } as Design;
    const solved = solveStage(design);
    const f = 2 / (2 * Math.PI * 22000 * 10e-12);
    expect(relativeError(tailImpedanceOhm(solved, f), 22000 / Math.sqrt(5))).toBeLessThan(1e-9);
  });

  test('a simple mirror of a three-parameter device with a wiring capacitance: its nodes without charge stay in the circuit, |Z| = Rout ∥ 1/(jωC)', () => {
    const design = {
      device: { family: 'npn', beta: 150, earlyVoltageV: 80, saturationCurrentA: 1e-14 },
      supply: { positiveV: 12, negativeV: -12 },
      collectorResistanceOhm: 10000,
      tail: { topology: 'simple-mirror', referenceResistanceOhm: 22000 },
      tailCapacitanceF: 10e-12,
    } as Design;
    const solved = solveStage(design);
    const rout = solved.result.tailOutputResistanceOhm;
    for (const x of [0.3, 1, 3]) {
      const f = x / (2 * Math.PI * rout * 10e-12);
      expect(relativeError(tailImpedanceOhm(solved, f), rout / Math.sqrt(1 + x * x)), `ω·Rout·C = ${x}`).toBeLessThan(1e-9);
    }
  });
});
