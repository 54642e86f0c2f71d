import type { ErrorSchema } from '@rjsf/utils';
import { describe, expect, test } from 'vitest';
import specSchema from '#shared/schema/spec.schema.json';
import { errorCount, withoutEditedFieldErrors } from '../../../web/src/features/specs/lib/edited-errors';
import { serverErrorsToErrorSchema } from '../../../web/src/features/specs/lib/server-errors';

describe('serverErrorsToErrorSchema', () => {
  test.each([
    ['/payload/supply/negativeV', { supply: { negativeV: { __errors: ['m'] } } }],
    ['/payload/cmrr/minDb', { cmrr: { minDb: { __errors: ['m'] } } }],
    ['/payload/outputSwingVpp', { outputSwingVpp: { __errors: ['m'] } }],
    ['/title', { title: { __errors: ['m'] } }],
    ['/payload/title', { title: { __errors: ['m'] } }],
    ['/payload', { __errors: ['m'] }],
    ['', { __errors: ['m'] }],
  ])('when the server names %s, then the message sits on that field', (path, expected) => {
    expect(serverErrorsToErrorSchema([{ path, message: 'm' }], specSchema)).toEqual(expected);
  });

  test('when several messages name fields, then each keeps its own, in order', () => {
    const errors = serverErrorsToErrorSchema(
      [
        { path: '/payload/supply/negativeV', message: 'must be < supply.positiveV (12 V), got 14 V' },
        { path: '/payload/supply/negativeV', message: 'second' },
        { path: '/payload/gain/target', message: 'is required' },
      ],
      specSchema,
    );
    expect(errors).toEqual({
      supply: { negativeV: { __errors: ['must be < supply.positiveV (12 V), got 14 V', 'second'] } },
      gain: { target: { __errors: ['is required'] } },
    });
    expect(errorCount(errors)).toBe(3);
  });

  test('when the path goes below a field the form shows (an array item), then the field gets it, the rest in words', () => {
    const errors = serverErrorsToErrorSchema([{ path: '/payload/topologies/6', message: 'must be one of resistor, wilson' }], specSchema);
    expect(errors).toEqual({ topologies: { __errors: ['item 7: must be one of resistor, wilson'] } });
  });

  test('when the path names a field the schema does not know, then its parent gets it with the name', () => {
    const errors = serverErrorsToErrorSchema([{ path: '/payload/supply/middleV', message: 'is not a known field here' }], specSchema);
    expect(errors).toEqual({ supply: { __errors: ['“middleV”: is not a known field here'] } });
  });

  test('when pointer segments are escaped, then they are read as RFC 6901 says', () => {
    expect(serverErrorsToErrorSchema([{ path: '/payload/a~1b/c~0d', message: 'm' }])).toEqual({ 'a/b': { 'c~d': { __errors: ['m'] } } });
  });

  test('when there are no details, then there are no errors', () => {
    expect(serverErrorsToErrorSchema([], specSchema)).toEqual({});
  });
});

describe('withoutEditedFieldErrors', () => {
  const errors = { __errors: ['whole'], supply: { negativeV: { __errors: ['rail'] }, positiveV: { __errors: ['other'] } } } as unknown as ErrorSchema;
  const before = { supply: { positiveV: 12, negativeV: 14 } };

  test('when a field is edited, then its server message goes and the others stay', () => {
    const after = { supply: { positiveV: 12, negativeV: -12 } };
    expect(withoutEditedFieldErrors(errors, before, after)).toEqual({ __errors: ['whole'], supply: { positiveV: { __errors: ['other'] } } });
  });

  test('when nothing changed, then every message stays', () => {
    expect(withoutEditedFieldErrors(errors, before, structuredClone(before))).toEqual(errors);
  });
});
