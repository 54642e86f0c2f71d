/**
 * The MOS level-1 parameter list (shared/engine/mos-parameters.ts): the contract's five names, and
 * ngspice's defaults as mos1set.c sets them [SPICE] (VTO 0, KP 2e-5, GAMMA 0, PHI 0.6, LAMBDA 0;
 * the SPICE3 user's guide lists the same).
 */
import { expect, test } from 'vitest';
import { MOS_PARAMETERS, MOS_PARAMETER_NAMES, resolvedMosParameters } from '#shared/engine/mos-parameters';

test('the five parameters the contract names for "nmos" and "pmos", in its order', () => {
  expect([...MOS_PARAMETER_NAMES]).toEqual(['VTO', 'KP', 'LAMBDA', 'GAMMA', 'PHI']);
  expect(Object.keys(MOS_PARAMETERS).sort()).toEqual([...MOS_PARAMETER_NAMES].sort());
});

test.each([
  ['VTO', 0, 'V'],
  ['KP', 2e-5, 'A/V²'],
  ['LAMBDA', 0, '1/V'],
  ['GAMMA', 0, '√V'],
  ['PHI', 0.6, 'V'],
] as const)('%s defaults to %s %s as in ngspice mos1set.c', (name, value, unit) => {
  expect(MOS_PARAMETERS[name].default).toBe(value);
  expect(MOS_PARAMETERS[name].unit).toBe(unit);
  expect(resolvedMosParameters({})[name]).toBe(value);
});

test('a card overrides only what it gives; a name outside the list is ignored', () => {
  const card = { VTO: -0.8, KP: 4e-5, XJ: 1e-6 } as Parameters<typeof resolvedMosParameters>[0];
  expect(resolvedMosParameters(card)).toEqual({ VTO: -0.8, KP: 4e-5, LAMBDA: 0, GAMMA: 0, PHI: 0.6 });
});
