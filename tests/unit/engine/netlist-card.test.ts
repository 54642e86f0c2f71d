/**
 * The netlist's `.model` line with a library card's SPICE-only parameters (`spiceOnlyParameters`):
 * written after the design's own, as SPICE3 `NAME=value` words, and nothing but plain parameter
 * names accepted, so no card text can become a line of the netlist. Values are invented.
 */
import { describe, expect, test } from 'vitest';
import { spiceNetlist } from '#shared/engine/netlist';
import type { Design } from '#shared/engine/types';
import { parseSpiceNumber } from '#shared/units/spice-number';

const DESIGN: Design = {
  device: { family: 'npn', beta: 180, earlyVoltageV: 72, saturationCurrentA: 9e-15 },
  supply: { positiveV: 12, negativeV: -12 },
  collectorResistanceOhm: 8200,
  tail: { topology: 'resistor', resistanceOhm: 10000 },
} as Design;

const modelLine = (netlist: string) => netlist.split('\n').filter((line) => /^\.model/i.test(line));

describe('spiceNetlist with a card’s SPICE-only parameters', () => {
  test('when the card gives TNOM and ITF, then they follow IS, BF and VAF on the one .model line, read back as given', () => {
    const [line, ...rest] = modelLine(spiceNetlist(DESIGN, { analysis: 'op', spiceOnlyParameters: { TNOM: 0, ITF: 0.35 } }));
    expect(rest).toEqual([]);
    const words = /\((.*)\)/.exec(line)![1].split(' ');
    expect(words.slice(0, 3).map((w) => w.split('=')[0])).toEqual(['IS', 'BF', 'VAF']);
    expect(words.slice(3).map((w) => w.split('='))).toEqual([
      ['TNOM', expect.any(String)],
      ['ITF', expect.any(String)],
    ]);
    expect(parseSpiceNumber(words[3].split('=')[1])).toBe(0);
    expect(parseSpiceNumber(words[4].split('=')[1])).toBeCloseTo(0.35, 12);
  });

  test('when no card parameters are given, then the .model line is the design’s alone', () => {
    const [line] = modelLine(spiceNetlist(DESIGN, { analysis: 'op' }));
    expect(line).not.toMatch(/TNOM|ITF/);
  });

  test('when a name is not a plain parameter name or a value not finite, then the netlist is refused', () => {
    expect(() => spiceNetlist(DESIGN, { analysis: 'op', spiceOnlyParameters: { 'X)\n.control': 1 } })).toThrow(/not a SPICE model parameter: "X\)\\n\.control"/);
    expect(() => spiceNetlist(DESIGN, { analysis: 'op', spiceOnlyParameters: { ITF: Number.NaN } })).toThrow(RangeError);
  });
});

