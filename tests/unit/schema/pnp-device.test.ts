/**
 * The PNP transistor a tail may need (`device.pnp`): ENGINE-CONTRACT.md, "New topology: ptat (needs
 * device.pnp)". A spec that lists the PTAT source, or a design whose tail is one, must give the PNP
 * (its current gain, or a model card); the spec's default options leave the PTAT source out, so a
 * spec that does not choose it needs no PNP. Refusals name the field by its JSON path.
 */
import { describe, expect, test } from 'vitest';
import { validateDesign, validateSpec } from '#shared/validate';
import { MINIMAL_DESIGN, MINIMAL_SPEC, paths, printed } from './schema-fixtures';

/** An invented PNP: current gain, Early voltage and IS in the usual small-signal ranges. */
const PNP = { beta: 115, earlyVoltageV: 52, saturationCurrentA: 4.1e-15 };
const PTAT_TAIL = { topology: 'ptat', emitterResistanceOhm: 330, startupResistanceOhm: 2_200_000, areaRatio: 8 };

describe('a spec that lists the PTAT source', () => {
  test('when it gives no PNP, then it is refused at /device/pnp, the message naming the tail and what to give', () => {
    const result = validateSpec({ ...MINIMAL_SPEC, topologies: ['widlar', 'ptat'] });
    expect(paths(result)).toEqual(['/device/pnp']);
    const [line] = printed(result);
    expect(line).toMatch(/^\/device\/pnp: is required: /);
    expect(line).toContain('PTAT (constant-gm) source');
    expect(line).toContain('PNP current gain');
    expect(line).toContain('model card');
  });

  test('when it gives the PNP, then it validates and keeps the PNP as given', () => {
    const result = validateSpec({ ...MINIMAL_SPEC, device: { pnp: PNP }, topologies: ['widlar', 'ptat'] });
    expect(result.ok && result.value.device.pnp).toEqual(PNP);
  });

  test('when the PNP has neither a current gain nor a model card, then its current gain is asked for', () => {
    expect(printed(validateSpec({ ...MINIMAL_SPEC, device: { pnp: { earlyVoltageV: 52 } }, topologies: ['ptat'] }))).toEqual([
      '/device/pnp/beta: is required unless the PNP SPICE model card is given',
    ]);
  });

  test('when the PNP is a model card alone, then it validates', () => {
    expect(paths(validateSpec({ ...MINIMAL_SPEC, device: { pnp: { model: { IS: 4.1e-15, BF: 115, VAF: 52 } } }, topologies: ['ptat'] }))).toEqual([]);
  });

  test('when the PNP’s current gain differs from its card’s BF, then the refusal names /device/pnp/beta, as for the NPN', () => {
    expect(printed(validateSpec({ ...MINIMAL_SPEC, device: { pnp: { beta: 90, model: { BF: 115 } } }, topologies: ['ptat'] }))).toEqual([
      "/device/pnp/beta: must equal the model card's BF (115 A/A), got 90 A/A",
    ]);
  });
});

describe('a spec that does not list the PTAT source', () => {
  test('when its options are the defaults, then they leave the PTAT source out and no PNP is needed', () => {
    const result = validateSpec(MINIMAL_SPEC);
    expect(result.ok && result.value.topologies).not.toContain('ptat');
    expect(result.ok && result.value.device.pnp).toBeUndefined();
  });

  test('when it lists other tails only, then it needs no PNP', () => {
    expect(paths(validateSpec({ ...MINIMAL_SPEC, topologies: ['resistor', 'cascode'] }))).toEqual([]);
  });
});

describe('a design with a PTAT tail', () => {
  test('when it gives no PNP, then it is refused at /device/pnp', () => {
    const result = validateDesign({ ...MINIMAL_DESIGN, tail: PTAT_TAIL });
    expect(paths(result)).toEqual(['/device/pnp']);
    expect(printed(result)[0]).toContain('the tail is the PTAT (constant-gm) source');
  });

  test('when it gives the PNP, then it validates with the output area ratio left out', () => {
    const result = validateDesign({ ...MINIMAL_DESIGN, device: { ...MINIMAL_DESIGN.device, pnp: PNP }, tail: PTAT_TAIL });
    expect(result.ok && result.value.tail).toMatchObject(PTAT_TAIL);
  });

  test.each([
    ['areaRatio', 1, '/tail/areaRatio'], // N must be more than 1: ln(1) = 0, no ΔVBE
    ['areaRatio', 100.5, '/tail/areaRatio'],
    ['outputAreaRatio', 0.005, '/tail/outputAreaRatio'],
  ])('when %s is %d, then it is refused at %s', (field, value, path) => {
    expect(paths(validateDesign({ ...MINIMAL_DESIGN, device: { ...MINIMAL_DESIGN.device, pnp: PNP }, tail: { ...PTAT_TAIL, [field]: value } }))).toEqual([path]);
  });

  test('when the tail is another one, then no PNP is needed', () => {
    expect(paths(validateDesign(MINIMAL_DESIGN))).toEqual([]);
  });
});
