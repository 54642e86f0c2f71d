import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, test } from 'vitest';
import { generatedTypes, TARGETS } from '../../../scripts/generate-types';
import specSchema from '#shared/schema/spec.schema.json';
import { validateSpec } from '#shared/validate';

describe('types generated from the JSON Schemas', () => {
  test.each(TARGETS.map((target) => [target.path, target] as const))('%s matches its schema (else run: npm run generate:types)', async (_, target) => {
    const checkedIn = readFileSync(fileURLToPath(new URL(`../../../${target.path}`, import.meta.url)), 'utf8');
    expect(checkedIn).toBe(await generatedTypes(target));
  });

  test('a schema change shows in the generated text', async () => {
    const [spec] = TARGETS;
    const schema = structuredClone(spec.schema) as { properties: Record<string, object> };
    schema.properties.outputSwingVpp = { type: 'string', description: 'Changed for the test.' };
    const changed = await generatedTypes({ ...spec, schema });
    expect(changed).toContain('outputSwingVpp?: string;');
    expect(changed).not.toBe(await generatedTypes(spec));
  });

  test('Spec types every defaulted field as present: validation fills each schema default into a minimal spec', () => {
    const result = validateSpec({ title: 'T', supply: { positiveV: 12, negativeV: -12 }, gain: { target: 100 }, cmrr: { minDb: 80 } });
    if (!result.ok) throw new Error(JSON.stringify(result.errors));
    const missing: string[] = [];
    const walk = (schema: { properties?: Record<string, { default?: unknown; properties?: object }> }, value: Record<string, unknown>, path: string) => {
      for (const [field, sub] of Object.entries(schema.properties ?? {})) {
        if ('default' in sub && !(field in value)) missing.push(`${path}/${field}`);
        if (sub.properties && value[field] !== undefined) walk(sub as never, value[field] as Record<string, unknown>, `${path}/${field}`);
      }
    };
    walk(specSchema as never, result.value as unknown as Record<string, unknown>, '');
    expect(missing).toEqual([]);
  });
});
