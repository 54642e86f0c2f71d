/**
 * The reference simulator's plumbing (tests/helpers/spice.ts), on circuits whose answers are
 * known in closed form: a resistive divider at DC and an RC low-pass over frequency. It runs in
 * the default project on the registry's ngspice and, where Debian's ngspice is installed, again
 * in the `reference-debian-ngspice` project on that program, so both ways of reading ngspice's
 * vectors (the WebAssembly build's result, Debian's binary raw file) are checked against circuit
 * theory before the reference files trust them to 0.01 %.
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { REFERENCE_SPICE_BUILD, runSpice, startSpice } from '../helpers/spice';

const ENGINE_START_TIMEOUT_MS = 120_000;
/** Both sides are exact linear solves in double precision. */
const EXACT = 1e-9;

const DIVIDER = ['resistive divider', 'VIN in 0 DC 3', 'R1 in out 1k', 'R2 out 0 2k', '.op', '.end', ''].join('\n');
const R_OHM = 1000;
const C_F = 1e-9;
const LOW_PASS = ['rc low-pass', 'VIN in 0 DC 0 AC 1', `R1 in out ${R_OHM}`, `C1 out 0 ${C_F}`, '.ac dec 10 1k 1meg', '.end', ''].join('\n');

function relative(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

describe(`the reference simulator (${REFERENCE_SPICE_BUILD} ngspice) returns ngspice's vectors`, () => {
  beforeAll(startSpice, ENGINE_START_TIMEOUT_MS);

  test('operating point of a divider: v(out) = 3 V · 2k/3k = 2 V, i(vin) = −1 mA (into the + terminal)', async () => {
    const result = await runSpice(DIVIDER, 'Operating Point');
    expect(result.dataType).toBe('real');
    const value = (name: string): number => result.data.find((d) => d.name.toLowerCase() === name)!.values[0] as number;
    expect(relative(value('v(out)'), 2)).toBeLessThanOrEqual(EXACT);
    expect(relative(value('v(in)'), 3)).toBeLessThanOrEqual(EXACT);
    expect(relative(value('i(vin)'), -1e-3)).toBeLessThanOrEqual(EXACT);
  });

  test('ac sweep of an RC low-pass: 31 points, 1 kHz to 1 MHz, v(out) = 1/(1 + j2πfRC) at each', async () => {
    const result = await runSpice(LOW_PASS, 'AC Analysis');
    expect(result.dataType).toBe('complex');
    if (result.dataType !== 'complex') return;
    const frequency = result.data.find((d) => d.name.toLowerCase() === 'frequency')!.values;
    const out = result.data.find((d) => d.name.toLowerCase() === 'v(out)')!.values;
    expect(frequency).toHaveLength(31);
    frequency.forEach((f, k) => {
      expect(relative(f.real, 1e3 * 10 ** (k / 10))).toBeLessThanOrEqual(EXACT);
      const x = 2 * Math.PI * f.real * R_OHM * C_F;
      // 1/(1 + jx) = (1 − jx)/(1 + x²)
      expect(relative(out[k].real, 1 / (1 + x * x)), `Re at ${f.real} Hz`).toBeLessThanOrEqual(EXACT);
      expect(relative(out[k].img, -x / (1 + x * x)), `Im at ${f.real} Hz`).toBeLessThanOrEqual(EXACT);
    });
  });

  test('a netlist ngspice refuses throws with its message; another plot than the one expected throws', async () => {
    await expect(runSpice(['unknown model', 'R1 a 0 1k', 'Q1 a b 0 NOSUCHMODEL', '.op', '.end', ''].join('\n'))).rejects.toThrow(/nosuchmodel/i);
    await expect(runSpice(DIVIDER, 'AC Analysis')).rejects.toThrow(/Operating Point/);
  });
});
