import { readFileSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import type { RJSFSchema } from '@rjsf/utils';
import specSchemaJson from '#shared/schema/spec.schema.json';
import { specValidator, SchemaMismatchError } from '../../../web/src/features/specs/lib/spec-validator';
import { GENERATED_PATH, specValidatorsModule } from '../../../scripts/compile-spec-validators';

const specSchema = specSchemaJson as RJSFSchema;

describe('precompiled spec validators', () => {
  test('the generated module matches shared/schema/spec.schema.json (else run: npx tsx scripts/compile-spec-validators.ts)', () => {
    expect(readFileSync(GENERATED_PATH, 'utf8')).toBe(specValidatorsModule());
  });

  test('a valid document passes and a wrong one fails with the server wording and the unit', () => {
    const validator = specValidator(specSchema);
    const valid = { title: 'T', supply: { positiveV: 12, negativeV: -12 }, gain: { target: 100 }, cmrr: { minDb: 80 } };
    expect(validator.validateFormData(valid, specSchema).errors).toEqual([]);
    const { errorSchema } = validator.validateFormData({ ...valid, supply: { positiveV: 12, negativeV: -140 } }, specSchema);
    expect(errorSchema.supply?.negativeV?.__errors).toEqual(['must be >= -100 V, got -140 V']);
  });

  test('a schema other than the compiled one is refused with a reload hint', () => {
    expect(() => specValidator({ ...specSchema, title: 'Changed' })).toThrow(SchemaMismatchError);
  });
});
