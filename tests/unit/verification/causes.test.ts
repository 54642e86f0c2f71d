/**
 * The likely cause of a difference between the engine and SPICE (shared/verification/causes.ts):
 * a SPICE-only parameter that can move that kind of figure first, then a saturated transistor,
 * else the engine's own difference. Which parameters move which figures follows ngspice's
 * bjtload.c: XTF, VTF and ITF only shape the transit-time charge (figures at a frequency), TNOM
 * sets every parameter's reference temperature (the operating point too).
 */
import { describe, expect, test } from 'vitest';
import { spiceOnlyParameterMoves } from '#shared/devices/model-card';
import { causeText, likelyCause } from '#shared/verification/causes';

describe('likelyCause', () => {
  test('when only charge-shaping parameters are simulated, then a DC figure is not put on them but on the saturated transistor', () => {
    const cause = likelyCause('dc', ['XTF', 'ITF'], spiceOnlyParameterMoves, [{ name: 'Q4', vbcV: 0.3 }]);
    expect(cause).toEqual({ kind: 'saturation', parameters: [], saturated: [{ name: 'Q4', vbcV: 0.3 }] });
  });

  test('when a figure at a frequency differs, then the charge-shaping parameters are its likely cause', () => {
    expect(likelyCause('ac', ['XTF', 'ITF', 'VBE_MAX'], spiceOnlyParameterMoves, [])).toEqual({ kind: 'spice-only-parameters', parameters: ['XTF', 'ITF'], saturated: [] });
  });

  test('when nothing the engine leaves out and no saturation explains it, then it is the engine’s own difference', () => {
    const cause = likelyCause('dc', [], spiceOnlyParameterMoves, []);
    expect(cause.kind).toBe('unexplained');
    expect(causeText(cause)).toMatch(/difference in the engine itself/);
  });

  test('when TNOM is simulated, then the words name it and the saturated transistor beside it', () => {
    const text = causeText(likelyCause('dc', ['TNOM'], spiceOnlyParameterMoves, [{ name: 'Q6', vbcV: 0.12 }]));
    expect(text).toMatch(/^Likely the card's TNOM: SPICE simulates it, the engine does not model it\. SPICE also finds Q6 \(VBC \+120 mV\) saturated here\.$/);
  });
});
