/**
 * A device without an Early voltage: SPICE reads VAF = 0 as infinite [SPICE], output
 * resistances then rest on GMIN alone, and the engine says so instead of presenting the
 * rejection as meaningful; that warning is about the input, not the operating point.
 */
import { expect, test } from 'vitest';
import { analyze } from '#shared/engine/analyze';
import type { Design } from '#shared/engine/types';

// Invented demo design.
const design: Design = {
  device: { family: 'npn', beta: 132, saturationCurrentA: 7.7e-15 },
  supply: { positiveV: 8, negativeV: -8 },
  collectorResistanceOhm: 4990,
  tail: { topology: 'simple-mirror', referenceResistanceOhm: 13300 },
};

test('VAF omitted: a warning names VAF, and it is not counted as an operating-point problem', () => {
  const result = analyze(design);
  expect(result.warnings.some((w) => w.includes('VAF'))).toBe(true);
  expect(result.operatingPointProblems).toEqual([]);
});

test('VAF given: no such warning', () => {
  const result = analyze({ ...design, device: { ...design.device, earlyVoltageV: 71 } });
  expect(result.warnings.some((w) => w.includes('VAF'))).toBe(false);
});
