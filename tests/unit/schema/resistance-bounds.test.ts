/**
 * Physical lower bounds on resistances and currents: every resistor field of a design is at least
 * 1 mΩ (the pair emitter resistor may also be 0, none), the spec's fixed tail current at least
 * 100 nA and IS at least 1e-20 A, and each field's description states its range.
 */
import { describe, expect, test } from 'vitest';
import designSchema from '#shared/schema/design.schema.json';
import specSchema from '#shared/schema/spec.schema.json';
import { validateDesign } from '#shared/validate';
import { MINIMAL_DESIGN, printed, TAILS } from './schema-fixtures';

/** A resistance no part has, far under any physical bound (the value the independent check used). */
const ABSURD_OHM = 1e-300;
const SMALLEST_OHM = 1e-3;

const tailResistorFields = TAILS.flatMap((tail) => Object.keys(tail).filter((key) => key.endsWith('Ohm')).map((field) => [tail.topology, field, tail] as const));

describe('resistances in a design', () => {
  test('a 1e-300 Ω collector resistor is refused, naming the field and the bound', () => {
    expect(printed(validateDesign({ ...MINIMAL_DESIGN, collectorResistanceOhm: ABSURD_OHM }))).toEqual(['/collectorResistanceOhm: must be >= 0.001 Ω, got 1e-300 Ω']);
  });

  test('a 1 mΩ collector resistor is accepted', () => {
    expect(validateDesign({ ...MINIMAL_DESIGN, collectorResistanceOhm: SMALLEST_OHM }).ok).toBe(true);
  });

  test.each(tailResistorFields)('%s tail: %s of 1e-300 Ω is refused, 1 mΩ accepted', (_topology, field, tail) => {
    // A PNP for the tails that need one (the PTAT source); the others ignore it
    const design = { ...MINIMAL_DESIGN, device: { ...MINIMAL_DESIGN.device, pnp: { beta: 95 } } };
    const result = validateDesign({ ...design, tail: { ...tail, [field]: ABSURD_OHM } });
    expect(result.ok).toBe(false);
    expect(printed(result)[0]).toMatch(new RegExp(`^/tail/${field}: must be >= 0.001`));
    expect(validateDesign({ ...design, tail: { ...tail, [field]: SMALLEST_OHM } }).ok).toBe(true);
  });

  test('the pair emitter resistor is 0 (none) or at least 1 mΩ', () => {
    expect(validateDesign({ ...MINIMAL_DESIGN, pairEmitterResistanceOhm: 0 }).ok).toBe(true);
    expect(validateDesign({ ...MINIMAL_DESIGN, pairEmitterResistanceOhm: SMALLEST_OHM }).ok).toBe(true);
    expect(printed(validateDesign({ ...MINIMAL_DESIGN, pairEmitterResistanceOhm: ABSURD_OHM }))).toEqual(['/pairEmitterResistanceOhm: must be 0 (none) or at least 1 mΩ, got 1e-300 Ω']);
  });
});

describe('the schemas state the bounds in their descriptions', () => {
  const text = (schema: unknown) => JSON.stringify(schema);

  test('every resistor field of the design schema says "1 mΩ"', () => {
    const descriptions: string[] = [];
    const walk = (node: unknown, key = ''): void => {
      if (Array.isArray(node)) node.forEach((child) => walk(child));
      else if (node && typeof node === 'object') {
        const record = node as Record<string, unknown>;
        if (key.endsWith('Ohm') && typeof record.description === 'string') descriptions.push(`${key}: ${record.description}`);
        for (const [childKey, child] of Object.entries(record)) walk(child, childKey);
      }
    };
    walk(designSchema);
    expect(descriptions.length).toBeGreaterThanOrEqual(5);
    for (const description of descriptions) expect(description).toMatch(/1 mΩ/);
  });

  test('the fixed tail current and IS state their lower bounds', () => {
    expect(text(specSchema)).toMatch(/"Fixes the tail current[^"]*from 100 nA/);
    expect(text(specSchema)).toMatch(/"Transport saturation current IS[^"]*from 1e-20 A/);
    expect(text(designSchema)).toMatch(/"Transport saturation current IS[^"]*from 1e-20 A/);
  });
});
