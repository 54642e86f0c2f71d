/**
 * Property-based invariants of the engine (fast-check), each built so that only the quantity
 * under test changes between the two circuits compared. Expected behaviour comes from DOMAIN.md
 * ("Gains and rejection"): single-ended CMRR ≈ gm·Rout ≈ Itail·Rout/(2·VT) [SS]; with a mirror
 * Itail·ro ≈ VA, so rejection grows with the Early voltage [GM]; with a resistor tail Itail·R is
 * the DC drop across it, so rejection is capped by the voltage that resistor can drop.
 * Continuous inputs are drawn uniformly over their range (uniformBetween: fc.double would crowd
 * a range around 0, such as a ±5 % mismatch, with values of tiny magnitude). numRuns is kept
 * modest so the suite stays fast.
 */
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { analyze, recommend } from '#shared/engine/index';
import type { Design, DeviceParams, TailDesign } from '#shared/engine/types';
import { isOnSeries } from '#shared/units/index';
import { validateSpec } from '#shared/validate';
import { loadRuleSet } from '../../../rules/index';
import { uniformBetween } from '../../helpers/arbitraries';

const NUM_RUNS = 50;

const deviceArb: fc.Arbitrary<DeviceParams> = fc.record({
  family: fc.constant('npn' as const),
  beta: fc.integer({ min: 40, max: 400 }),
  earlyVoltageV: fc.integer({ min: 15, max: 250 }),
  saturationCurrentA: fc.constantFrom(1e-16, 8e-16, 5e-15, 2e-14),
});

/** Sets RC so that Q1's DC drop across it is `dropV`, from a first solve with a tiny RC (RC barely touches the bias). */
function withCollectorDrop(design: Design, dropV: number): Design {
  const icA = analyze({ ...design, collectorResistanceOhm: 1 }).collectorCurrentA;
  return { ...design, collectorResistanceOhm: dropV / icA };
}

describe('rejection and the tail output resistance', () => {
  test('resistor tail: a larger R at the same tail current (negative rail moved to keep it) gives higher single-ended CMRR [SS]', () => {
    fc.assert(
      fc.property(
        deviceArb,
        fc.integer({ min: 1000, max: 20000 }),
        uniformBetween(1.2, 6),
        uniformBetween(-12, -3),
        uniformBetween(0.5, 4),
        (device, r1Ohm, factor, negativeV, dropV) => {
          const first = withCollectorDrop(
            { device, supply: { positiveV: 10, negativeV }, collectorResistanceOhm: 1, tail: { topology: 'resistor', resistanceOhm: r1Ohm } },
            dropV,
          );
          const a = analyze(first);
          // Same tail-node voltage and current through a larger R: the rail moves down by I·ΔR
          const r2Ohm = r1Ohm * factor;
          const second: Design = { ...first, supply: { positiveV: 10, negativeV: a.tailNodeVoltageV - a.tailCurrentA * r2Ohm }, tail: { topology: 'resistor', resistanceOhm: r2Ohm } };
          const b = analyze(second);
          expect(Math.abs(b.tailCurrentA - a.tailCurrentA) / a.tailCurrentA).toBeLessThan(1e-6); // the construction held
          expect(Math.abs(b.differentialGain - a.differentialGain) / Math.abs(a.differentialGain)).toBeLessThan(1e-6); // t is a virtual ground for Ad
          expect(b.tailOutputResistanceOhm).toBeGreaterThan(a.tailOutputResistanceOhm);
          expect(b.cmrrDb.singleEnded).toBeGreaterThan(a.cmrrDb.singleEnded);
        },
      ),
      { numRuns: NUM_RUNS },
    );
  });

  test('mirror vs degenerated mirror at the same current: the emitter resistors raise Rout and the single-ended CMRR [GM]', () => {
    fc.assert(
      fc.property(
        deviceArb,
        fc.integer({ min: 8000, max: 60000 }),
        uniformBetween(0.1, 1),
        uniformBetween(1, 4),
        (device, rRefOhm, degenerationDropV, dropV) => {
          const supply = { positiveV: 12, negativeV: -12 };
          const plain = withCollectorDrop({ device, supply, collectorResistanceOhm: 1, tail: { topology: 'simple-mirror', referenceResistanceOhm: rRefOhm } }, dropV);
          const a = analyze(plain);
          // Same output current: start from Rref shortened by the emitter resistor, then scale Rref
          // (the current goes as 1/Rref) until the tail currents agree
          const reOhm = degenerationDropV / a.referenceCurrentA;
          let rRefDegeneratedOhm = rRefOhm - reOhm;
          const degeneratedWith = (r: number): Design => ({ ...plain, tail: { topology: 'degenerated-mirror', referenceResistanceOhm: r, emitterResistanceOhm: reOhm } });
          for (let k = 0; k < 6; k += 1) rRefDegeneratedOhm *= analyze(degeneratedWith(rRefDegeneratedOhm)).tailCurrentA / a.tailCurrentA;
          const b = analyze(degeneratedWith(rRefDegeneratedOhm));
          expect(Math.abs(b.tailCurrentA - a.tailCurrentA) / a.tailCurrentA).toBeLessThan(1e-3); // the construction held
          // Rout grows by about 1 + gm·(RE ∥ rπ) ≈ 5 ... 40 [GM]
          expect(b.tailOutputResistanceOhm).toBeGreaterThan(2 * a.tailOutputResistanceOhm);
          expect(b.cmrrDb.singleEnded).toBeGreaterThan(a.cmrrDb.singleEnded);
        },
      ),
      { numRuns: NUM_RUNS },
    );
  });

  test('mirror tails: single-ended CMRR rises with the Early voltage [GM]', () => {
    const tailArb: fc.Arbitrary<TailDesign> = fc.oneof(
      fc.integer({ min: 10000, max: 60000 }).map((r): TailDesign => ({ topology: 'simple-mirror', referenceResistanceOhm: r })),
      fc.integer({ min: 10000, max: 60000 }).map((r): TailDesign => ({ topology: 'degenerated-mirror', referenceResistanceOhm: r, emitterResistanceOhm: r / 40 })),
      fc.integer({ min: 3000, max: 12000 }).map((r): TailDesign => ({ topology: 'widlar', referenceResistanceOhm: r, emitterResistanceOhm: 100 })),
      fc.integer({ min: 10000, max: 60000 }).map((r): TailDesign => ({ topology: 'wilson', referenceResistanceOhm: r })),
      fc.integer({ min: 10000, max: 60000 }).map((r): TailDesign => ({ topology: 'cascode', referenceResistanceOhm: r })),
    );
    fc.assert(
      fc.property(
        deviceArb,
        tailArb,
        fc.integer({ min: 10, max: 150 }),
        uniformBetween(1.3, 5),
        uniformBetween(1, 4),
        (device, tail, vaf1V, factor, dropV) => {
          const base: Design = { device: { ...device, earlyVoltageV: vaf1V }, supply: { positiveV: 12, negativeV: -12 }, collectorResistanceOhm: 1, tail };
          const a = analyze(withCollectorDrop(base, dropV));
          const b = analyze(withCollectorDrop({ ...base, device: { ...device, earlyVoltageV: vaf1V * factor } }, dropV));
          expect(b.tailOutputResistanceOhm).toBeGreaterThan(a.tailOutputResistanceOhm);
          expect(b.cmrrDb.singleEnded).toBeGreaterThan(a.cmrrDb.singleEnded);
        },
      ),
      { numRuns: NUM_RUNS },
    );
  });

  test('resistor tail: at a fixed drop across RC (fixed gain), CMRR rises with the tail current through the same R [DOMAIN]', () => {
    fc.assert(
      fc.property(
        deviceArb,
        fc.integer({ min: 2000, max: 20000 }),
        uniformBetween(-15, -2),
        uniformBetween(1, 20),
        uniformBetween(0.5, 4),
        (device, rOhm, negativeV, extraDropV, dropV) => {
          // The same resistor dropping more voltage (rail moved down) carries more current;
          // RC follows so that IC·RC, and so the gain IC·RC/VT, stays put [SS]
          const tail: TailDesign = { topology: 'resistor', resistanceOhm: rOhm };
          const a = analyze(withCollectorDrop({ device, supply: { positiveV: 10, negativeV }, collectorResistanceOhm: 1, tail }, dropV));
          const b = analyze(withCollectorDrop({ device, supply: { positiveV: 10, negativeV: negativeV - extraDropV }, collectorResistanceOhm: 1, tail }, dropV));
          expect(b.tailCurrentA).toBeGreaterThan(a.tailCurrentA);
          expect(Math.abs(b.differentialGain - a.differentialGain) / Math.abs(a.differentialGain)).toBeLessThan(0.02);
          expect(b.cmrrDb.singleEnded).toBeGreaterThan(a.cmrrDb.singleEnded);
        },
      ),
      { numRuns: NUM_RUNS },
    );
  });
});

describe('analyze is a pure function', () => {
  const tailArb: fc.Arbitrary<TailDesign> = fc.oneof(
    fc.integer({ min: 1000, max: 50000 }).map((r): TailDesign => ({ topology: 'resistor', resistanceOhm: r })),
    fc.integer({ min: 5000, max: 80000 }).map((r): TailDesign => ({ topology: 'simple-mirror', referenceResistanceOhm: r })),
    fc.integer({ min: 5000, max: 80000 }).map((r): TailDesign => ({ topology: 'degenerated-mirror', referenceResistanceOhm: r, emitterResistanceOhm: r / 30 })),
    fc.integer({ min: 2000, max: 20000 }).map((r): TailDesign => ({ topology: 'widlar', referenceResistanceOhm: r, emitterResistanceOhm: r / 50 })),
    fc.integer({ min: 5000, max: 80000 }).map((r): TailDesign => ({ topology: 'wilson', referenceResistanceOhm: r })),
    fc.integer({ min: 5000, max: 80000 }).map((r): TailDesign => ({ topology: 'cascode', referenceResistanceOhm: r })),
  );
  const designArb: fc.Arbitrary<Design> = fc.record({
    device: deviceArb,
    supply: fc.constantFrom({ positiveV: 12, negativeV: -12 }, { positiveV: 5, negativeV: -5 }, { positiveV: 15, negativeV: -15 }),
    collectorResistanceOhm: fc.integer({ min: 500, max: 20000 }),
    collectorMismatch: uniformBetween(-0.05, 0.05),
    tail: tailArb,
    inputCommonModeV: uniformBetween(-1, 1),
    temperatureC: fc.integer({ min: -40, max: 125 }),
    tailCapacitanceF: fc.constantFrom(0, 1e-12, 2.2e-11),
  });

  test('the same design analysed twice gives the same figures (byte-identical JSON)', () => {
    fc.assert(
      fc.property(designArb, (design) => {
        expect(JSON.stringify(analyze(structuredClone(design)))).toBe(JSON.stringify(analyze(structuredClone(design))));
      }),
      { numRuns: NUM_RUNS },
    );
  });

  test('matched pair, any design: Ase = Ad/2 and the differential common-mode gain is 0 (invariant)', () => {
    fc.assert(
      fc.property(designArb, (design) => {
        const result = analyze({ ...design, collectorMismatch: 0 });
        expect(Math.abs(result.singleEndedGain - result.differentialGain / 2)).toBeLessThanOrEqual(1e-9 * Math.abs(result.differentialGain));
        expect(result.differentialCommonModeGain).toBe(0);
        expect(result.cmrrDb.differential).toBeNull();
      }),
      { numRuns: NUM_RUNS },
    );
  });
});

describe('recommend: sized values on the spec series [IEC60063]', () => {
  test('every resistor of every sized option is a member of the spec series', async () => {
    const ruleSet = await loadRuleSet();
    const specArb = fc.record({
      series: fc.constantFrom('E24' as const, 'E96' as const, 'E192' as const),
      railV: fc.integer({ min: 5, max: 24 }),
      singleSupply: fc.boolean(),
      gainTarget: fc.integer({ min: 5, max: 150 }),
      output: fc.constantFrom('differential' as const, 'single-ended' as const),
      powerBudgetW: fc.constantFrom(0.01, 0.05, 0.2),
      topologies: fc.subarray(['resistor', 'simple-mirror', 'degenerated-mirror', 'widlar', 'wilson', 'cascode'] as const, { minLength: 1 }),
      beta: fc.integer({ min: 60, max: 400 }),
    });
    let optionsChecked = 0;
    await fc.assert(
      fc.asyncProperty(specArb, async (s) => {
        const negativeV = s.singleSupply ? 0 : -s.railV;
        const midV = (s.railV + negativeV) / 2;
        const validated = validateSpec({
          title: 'Quillfen property run',
          device: { beta: s.beta, earlyVoltageV: 70, saturationCurrentA: 3e-15 },
          supply: { positiveV: s.railV, negativeV },
          gain: { target: s.gainTarget, output: s.output },
          cmrr: { minDb: 60 },
          inputCommonMode: { minV: midV - 0.5, maxV: midV + 0.5 },
          powerBudgetW: s.powerBudgetW,
          resistors: { series: s.series },
          topologies: [...s.topologies],
          monteCarlo: { samples: 100, seed: 3 },
        });
        if (!validated.ok) throw new Error(JSON.stringify(validated.errors));
        const result = await recommend(validated.value, ruleSet);
        for (const option of result.options) {
          if (!option.design) continue;
          optionsChecked += 1;
          const tail = option.design.tail as Record<string, unknown>;
          const pairReOhm = option.design.pairEmitterResistanceOhm ?? 0;
          const values = [option.design.collectorResistanceOhm, ...(pairReOhm > 0 ? [pairReOhm] : []), ...Object.keys(tail).filter((k) => k.endsWith('Ohm')).map((k) => tail[k] as number)];
          for (const valueOhm of values) expect(isOnSeries(valueOhm, s.series), `${valueOhm} Ω on ${s.series}`).toBe(true);
        }
      }),
      { numRuns: 30 },
    );
    expect(optionsChecked).toBeGreaterThan(30); // sizing produced designs, so the property was not vacuous
  });
});
