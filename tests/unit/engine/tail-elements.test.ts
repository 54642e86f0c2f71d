/**
 * The circuit stamp of each tail (shared/engine/tail-elements.ts): the connections the contract's
 * table gives each topology (ENGINE-CONTRACT.md, "Tail elements": from the tail node `t` to the
 * negative rail), and the solver's starting guesses, which are the hand analysis of
 * docs/device-and-formulas.md: a diode-connected transistor's base one VBE above its emitter,
 * Iref = (V+ − V− − n·VBE)/RREF, and the Widlar source's Iout·RE = VT·ln(Iref/Iout) [GM].
 */
import { describe, expect, test } from 'vitest';
import { isMosfet, isTransistor, stageCircuit, type CircuitElement } from '#shared/engine/circuit';
import { deviceModel } from '#shared/engine/device';
import { solveOperatingPoint } from '#shared/engine/operating-point';
import { tailElements, type TailGuessContext } from '#shared/engine/tail-elements';
import type { TailDesign } from '#shared/engine/types';

const CTX: TailGuessContext = { positiveV: 15, negativeV: -9, tailNodeGuessV: 0.35, vbeGuessV: 0.6 };
/** The room temperature VT the guesses use, about kT/q at 27 °C [SI]. */
const GUESS_VT = 0.0259;

/** Each element as a line "name kind nodes value" (transistors: C B E). */
function stamp(tail: TailDesign, ctx = CTX): string[] {
  return tailElements(tail, ctx).elements.map((e: CircuitElement) => {
    expect(e.part).toBe('tail');
    if (isTransistor(e)) {
      expect(e.substrate).toBe('vn');
      return `${e.name} ${e.kind} ${e.collector} ${e.base} ${e.emitter}${e.area !== 1 ? ` area ${e.area}` : ''}`;
    }
    if (e.kind === 'resistor') return `${e.name} R ${e.nodes.join(' ')} ${e.resistanceOhm}`;
    if (isMosfet(e)) return `${e.name} ${e.kind} ${e.drain} ${e.gate} ${e.source} ${e.body}`;
    return `${e.name} C ${e.nodes.join(' ')} ${e.capacitanceF}`;
  });
}

describe('connections, as the contract\'s table gives them', () => {
  test('resistor: RT from t to the negative rail', () => {
    expect(stamp({ topology: 'resistor', resistanceOhm: 9100 })).toEqual(['RT R t vn 9100']);
  });

  test('ptat: the ΔVBE cell Q3 (diode, at V−) and Q4 (area N, emitter through R), the PNP mirror Q7/Q8 from V+ (Q8 diode-connected), the start-up resistor to Q3, Q9 sharing Q3\'s base with its collector at t (contract, "New topology: ptat")', () => {
    const lines = stamp({ topology: 'ptat', emitterResistanceOhm: 330, startupResistanceOhm: 1.5e6, areaRatio: 8, outputAreaRatio: 2 }).sort();
    expect(lines).toEqual([
      'Q3 npn ref ref vn',
      'Q4 npn p4 ref e4 area 8',
      'Q7 pnp ref p4 vp',
      'Q8 pnp p4 p4 vp',
      'Q9 npn t ref vn area 2',
      'RE4 R e4 vn 330',
      'RSU R vp ref 1500000',
    ]);
    // the output area ratio defaults to 1
    expect(stamp({ topology: 'ptat', emitterResistanceOhm: 330, startupResistanceOhm: 1.5e6, areaRatio: 8 })).toContain('Q9 npn t ref vn');
  });

  test('simple mirror: Q3 diode-connected fed through RREF, Q4 sharing its base with its collector at t, both emitters at V−', () => {
    expect(stamp({ topology: 'simple-mirror', referenceResistanceOhm: 22000 }).sort()).toEqual(['Q3 npn ref ref vn', 'Q4 npn t ref vn', 'RREF R vp ref 22000']);
  });

  test('degenerated mirror: as the simple mirror, with an equal RE from each emitter to V−', () => {
    expect(stamp({ topology: 'degenerated-mirror', referenceResistanceOhm: 20000, emitterResistanceOhm: 1000 }).sort()).toEqual([
      'Q3 npn ref ref e3',
      'Q4 npn t ref e4',
      'RE3 R e3 vn 1000',
      'RE4 R e4 vn 1000',
      'RREF R vp ref 20000',
    ]);
  });

  test('Widlar: as the simple mirror, with RE under Q4 only', () => {
    expect(stamp({ topology: 'widlar', referenceResistanceOhm: 4700, emitterResistanceOhm: 82 }).sort()).toEqual([
      'Q3 npn ref ref vn',
      'Q4 npn t ref e4',
      'RE4 R e4 vn 82',
      'RREF R vp ref 4700',
    ]);
  });

  test('Wilson: Q3 fed through RREF with its base at x; Q5 from t to x, base at Q3\'s collector; Q4 diode-connected at x', () => {
    expect(stamp({ topology: 'wilson', referenceResistanceOhm: 22000 }).sort()).toEqual(['Q3 npn ref x vn', 'Q4 npn x x vn', 'Q5 npn t ref x', 'RREF R vp ref 22000']);
  });

  test('cascode: Q3/Q4 mirror at the bottom, Q5 diode-connected on Q3 fed through RREF, Q6 on Q4 with its base at Q5\'s, collector at t', () => {
    expect(stamp({ topology: 'cascode', referenceResistanceOhm: 22000 }).sort()).toEqual([
      'Q3 npn m3 m3 vn',
      'Q4 npn m4 m3 vn',
      'Q5 npn ref ref m3',
      'Q6 npn t ref m4',
      'RREF R vp ref 22000',
    ]);
  });
});

describe('starting guesses from hand analysis', () => {
  const span = CTX.positiveV - CTX.negativeV;
  const vbe = CTX.vbeGuessV;
  const vn = CTX.negativeV;

  test('resistor: the current the tail node\'s guess drives through RT; none when the guess sits below the rail', () => {
    const guess = tailElements({ topology: 'resistor', resistanceOhm: 9400 }, CTX);
    expect(guess.currentGuessA).toBeCloseTo((0.35 + 9) / 9400, 15);
    expect(guess.initialGuessV).toEqual({});
    expect(tailElements({ topology: 'resistor', resistanceOhm: 9400 }, { ...CTX, tailNodeGuessV: -9.5 }).currentGuessA).toBe(0);
  });

  test('simple mirror: Iref = (V+ − V− − VBE)/RREF, the shared base one VBE above V−', () => {
    const guess = tailElements({ topology: 'simple-mirror', referenceResistanceOhm: 23400 }, CTX);
    expect(guess.currentGuessA).toBeCloseTo((span - vbe) / 23400, 15);
    expect(guess.initialGuessV).toEqual({ ref: expect.closeTo(vn + vbe, 12) });
  });

  test('degenerated mirror: Iref = (V+ − V− − VBE)/(RREF + RE); the emitters Iref·RE above V−, the base a VBE above them', () => {
    const guess = tailElements({ topology: 'degenerated-mirror', referenceResistanceOhm: 20000, emitterResistanceOhm: 1000 }, CTX);
    const iref = (span - vbe) / 21000;
    expect(guess.currentGuessA).toBeCloseTo(iref, 15);
    expect(guess.initialGuessV).toEqual({ ref: expect.closeTo(vn + iref * 1000 + vbe, 12), e3: expect.closeTo(vn + iref * 1000, 12), e4: expect.closeTo(vn + iref * 1000, 12) });
  });

  test('Widlar: the output current solves Iout·RE = VT·ln(Iref/Iout); RE\'s top sits Iout·RE above V−', () => {
    const guess = tailElements({ topology: 'widlar', referenceResistanceOhm: 4680, emitterResistanceOhm: 150 }, CTX);
    const iref = (span - vbe) / 4680;
    const out = guess.currentGuessA;
    expect(out).toBeGreaterThan(iref / 100);
    expect(out).toBeLessThan(iref);
    expect(out * 150).toBeCloseTo(GUESS_VT * Math.log(iref / out), 9);
    expect(guess.initialGuessV).toEqual({ ref: expect.closeTo(vn + vbe, 12), e4: expect.closeTo(vn + out * 150, 12) });
  });

  test('Widlar with a huge RE: the output current stays at 10⁻⁴ of the reference current, its least', () => {
    const guess = tailElements({ topology: 'widlar', referenceResistanceOhm: 4680, emitterResistanceOhm: 1e9 }, CTX);
    expect(guess.currentGuessA).toBeCloseTo(((span - vbe) / 4680) * 1e-4, 18);
  });

  test.each(['wilson', 'cascode'] as const)('%s: Iref = (V+ − V− − 2·VBE)/RREF, two VBE stacked in the reference path', (topology) => {
    const guess = tailElements({ topology, referenceResistanceOhm: 22800 }, CTX);
    expect(guess.currentGuessA).toBeCloseTo((span - 2 * vbe) / 22800, 15);
    const expected = topology === 'wilson' ? { ref: vn + 2 * vbe, x: vn + vbe } : { ref: vn + 2 * vbe, m3: vn + vbe, m4: vn + vbe };
    expect(guess.initialGuessV).toEqual(Object.fromEntries(Object.entries(expected).map(([k, v]) => [k, expect.closeTo(v, 12)])));
  });

  test.each([
    ['simple-mirror', { topology: 'simple-mirror', referenceResistanceOhm: 1000 }],
    ['degenerated-mirror', { topology: 'degenerated-mirror', referenceResistanceOhm: 1000, emitterResistanceOhm: 100 }],
    ['widlar', { topology: 'widlar', referenceResistanceOhm: 1000, emitterResistanceOhm: 100 }],
    ['wilson', { topology: 'wilson', referenceResistanceOhm: 1000 }],
    ['cascode', { topology: 'cascode', referenceResistanceOhm: 1000 }],
  ] as const)('%s: rails closer than the VBEs guess no reference current rather than a negative one', (_, tail) => {
    const guess = tailElements(tail as TailDesign, { positiveV: 0.5, negativeV: 0, tailNodeGuessV: 0, vbeGuessV: 0.6 });
    expect(guess.currentGuessA).toBe(0);
  });
});

describe('starting guesses with the device\'s VBE at each current', () => {
  // VBE = VT·ln(I/IS), the Ebers–Moll forward junction [GM]; IS invented for the test
  const IS_A = 2e-15;
  const vbeAtV = (currentA: number) => GUESS_VT * Math.log(currentA / IS_A);
  const ctx: TailGuessContext = { ...CTX, vbeAtV };
  /** Iref solving Iref = (V+ − V− − n·VBE(Iref))/R, by bisection (independent of the guess's fixed point). */
  function referenceA(junctions: number, ohm: number): number {
    let low = 1e-12;
    let high = (CTX.positiveV - CTX.negativeV) / ohm;
    for (let i = 0; i < 200; i += 1) {
      const mid = Math.sqrt(low * high);
      if (mid * ohm + junctions * vbeAtV(mid) > CTX.positiveV - CTX.negativeV) high = mid;
      else low = mid;
    }
    return low;
  }

  test('simple mirror: the reference current and the shared base at the VBE of that current, within 0.1 % and 0.1 mV', () => {
    const guess = tailElements({ topology: 'simple-mirror', referenceResistanceOhm: 23400 }, ctx);
    const iref = referenceA(1, 23400);
    expect(Math.abs(guess.currentGuessA / iref - 1)).toBeLessThan(1e-3);
    expect(Math.abs(guess.initialGuessV.ref - (CTX.negativeV + vbeAtV(iref)))).toBeLessThan(1e-4);
  });

  test.each(['wilson', 'cascode'] as const)('%s: two VBE of the reference current stacked, within 0.1 % and 0.2 mV', (topology) => {
    const guess = tailElements({ topology, referenceResistanceOhm: 22800 }, ctx);
    const iref = referenceA(2, 22800);
    expect(Math.abs(guess.currentGuessA / iref - 1)).toBeLessThan(1e-3);
    expect(Math.abs(guess.initialGuessV.ref - (CTX.negativeV + 2 * vbeAtV(iref)))).toBeLessThan(2e-4);
  });

  test('Widlar: the reference side at the reference current; the output from Iout·RE = VT·ln(Iref/Iout) with that Iref', () => {
    const guess = tailElements({ topology: 'widlar', referenceResistanceOhm: 4680, emitterResistanceOhm: 150 }, ctx);
    const iref = referenceA(1, 4680);
    expect(Math.abs(guess.initialGuessV.ref - (CTX.negativeV + vbeAtV(iref)))).toBeLessThan(1e-4);
    expect(guess.currentGuessA * 150).toBeCloseTo(GUESS_VT * Math.log(iref / guess.currentGuessA), 4);
  });

  test('Widlar at the device\'s own VT (34.3 mV, about 125 °C): Iout·RE = VT·ln(Iref/Iout) with that VT', () => {
    const vtV = 0.0343;
    const guess = tailElements({ topology: 'widlar', referenceResistanceOhm: 4680, emitterResistanceOhm: 150 }, { ...ctx, thermalVoltageV: vtV });
    const iref = referenceA(1, 4680);
    expect(guess.currentGuessA * 150).toBeCloseTo(vtV * Math.log(iref / guess.currentGuessA), 6);
    expect(Math.abs(guess.currentGuessA * 150 - GUESS_VT * Math.log(iref / guess.currentGuessA))).toBeGreaterThan(1e-3);
  });
});

describe('what the guesses are for: Newton starts close enough to need few steps', () => {
  // The stage's device VBE at each current and its VT, as analyze passes them; the operating point then
  // converges in at most four Newton steps (each a factorisation of the node equations) on every
  // topology at three rails and three temperatures. With one VBE for every junction it took six.
  const device = { family: 'npn' as const, beta: 150, earlyVoltageV: 80, saturationCurrentA: 6e-15 };
  const tails: TailDesign[] = [
    { topology: 'resistor', resistanceOhm: 18000 },
    { topology: 'simple-mirror', referenceResistanceOhm: 33000 },
    { topology: 'degenerated-mirror', referenceResistanceOhm: 30000, emitterResistanceOhm: 1500 },
    { topology: 'widlar', referenceResistanceOhm: 8200, emitterResistanceOhm: 560 },
    { topology: 'wilson', referenceResistanceOhm: 30000 },
    { topology: 'cascode', referenceResistanceOhm: 30000 },
  ];
  const rows = tails.flatMap((tail) => [5, 12, 24].flatMap((railV) => [-40, 27, 125].map((temperatureC) => ({ topology: tail.topology, tail, railV, temperatureC }))));
  test.each(rows)('$topology, ±$railV V, $temperatureC °C: at most 4 Newton steps', ({ tail, railV, temperatureC }) => {
    const design = { device, supply: { positiveV: railV, negativeV: -railV }, collectorResistanceOhm: 4700 * (railV / 12), tail, inputCommonModeV: 0, temperatureC };
    const model = deviceModel(device, temperatureC);
    const vbeAtV = (currentA: number) => model.thermalVoltageV * Math.log(currentA / model.saturationCurrentA);
    const op = solveOperatingPoint(stageCircuit(design, vbeAtV(1e-4), vbeAtV, model.thermalVoltageV), model);
    expect(op.iterations).toBeLessThanOrEqual(4);
  });
});
