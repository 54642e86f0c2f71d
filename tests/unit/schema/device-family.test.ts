/**
 * The device family (`device.family`, ENGINE-CONTRACT.md version 2, "Families"): "npn" (the
 * default) or "pnp", the mirror image fed from the other rail. A PNP stage takes every tail built
 * from its own device; the PTAT source needs a mirror of the opposite type (an NPN stage's PNP),
 * so a PNP design with it, or a PNP spec listing it, is refused at the tail's field with a reason.
 */
import { describe, expect, test } from 'vitest';
import { validateDesign, validateSpec } from '#shared/validate';
import { MINIMAL_DESIGN, MINIMAL_SPEC, paths, printed } from './schema-fixtures';

const PTAT_TAIL = { topology: 'ptat', emitterResistanceOhm: 330, startupResistanceOhm: 2_200_000, areaRatio: 8 };

describe('a design’s device family', () => {
  test('"pnp" is accepted with every tail built from the stage’s own device, and "npn" stays the default', () => {
    const pnp = validateDesign({ ...MINIMAL_DESIGN, device: { family: 'pnp', beta: 90 } });
    expect(paths(pnp)).toEqual([]);
    expect(pnp.ok && pnp.value.device.family).toBe('pnp');
    const plain = validateDesign(MINIMAL_DESIGN);
    expect(plain.ok && plain.value.device.family).toBe('npn');
  });

  test('another family is refused at /device/family', () => {
    expect(paths(validateDesign({ ...MINIMAL_DESIGN, device: { family: 'jfet', beta: 90 } }))).toEqual(['/device/family']);
  });

  test('a PNP design with the PTAT tail is refused at /tail/topology, saying why and what to choose', () => {
    const result = validateDesign({ ...MINIMAL_DESIGN, device: { family: 'pnp', beta: 90 }, tail: PTAT_TAIL });
    expect(printed(result)).toHaveLength(1);
    const [message] = printed(result);
    expect(message).toMatch(/^\/tail\/topology: the tail is the PTAT \(constant-gm\) source, which needs an NPN pair/);
    expect(message).toContain('choose another tail or the NPN family');
  });

  test('an NPN design with the PTAT tail still asks for its PNP at /device/pnp', () => {
    expect(paths(validateDesign({ ...MINIMAL_DESIGN, tail: PTAT_TAIL }))).toEqual(['/device/pnp']);
  });
});

describe('a spec’s device family', () => {
  test('a PNP spec listing the PTAT source is refused at /topologies; without it, it is accepted', () => {
    expect(paths(validateSpec({ ...MINIMAL_SPEC, device: { family: 'pnp' }, topologies: ['widlar', 'ptat'] }))).toEqual(['/topologies']);
    expect(paths(validateSpec({ ...MINIMAL_SPEC, device: { family: 'pnp' }, topologies: ['widlar', 'cascode'] }))).toEqual([]);
  });
});
