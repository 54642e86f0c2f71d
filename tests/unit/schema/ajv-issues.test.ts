import AjvImport, { type SchemaObject } from 'ajv';
import { describe, expect, test } from 'vitest';
import { PLAIN_LINES_PATTERN, PLAIN_LINE_PATTERN, PLAIN_NAME_PATTERN } from '#shared/text/plain-text';
import { issuesFromAjvErrors } from '#shared/validation/ajv-issues';
import { formatIssue, pointerSegment } from '#shared/validation/validation-issue';

// ajv's own errors on small schemas, turned into issues: what a person reads for each keyword.
// The errors come from ajv itself (the validator the server uses, same options), not from fixtures.
const Ajv = (AjvImport as unknown as { default?: typeof AjvImport }).default ?? AjvImport;

function issuesFor(schema: SchemaObject, data: unknown, options: Record<string, unknown> = {}): string[] {
  const ajv = new Ajv({ allErrors: true, verbose: true, discriminator: true, ...options });
  ajv.addKeyword('x-unit');
  const validate = ajv.compile(schema);
  expect(validate(data)).toBe(false);
  return issuesFromAjvErrors(validate.errors ?? []).map(formatIssue);
}

const field = (schema: SchemaObject): SchemaObject => ({ type: 'object', properties: { f: schema } });

describe('issuesFromAjvErrors: lengths, items and types', () => {
  test('minLength 1 reads "must not be empty", a longer minimum names its count', () => {
    expect(issuesFor(field({ type: 'string', minLength: 1 }), { f: '' })).toEqual(['/f: must not be empty']);
    expect(issuesFor(field({ type: 'string', minLength: 3 }), { f: 'ab' })).toEqual(['/f: must be at least 3 characters']);
    expect(issuesFor(field({ type: 'string', maxLength: 2 }), { f: 'abc' })).toEqual(['/f: must be at most 2 characters']);
  });

  test('minItems and uniqueItems name the count and the repeated items (ajv reports the later index first)', () => {
    expect(issuesFor(field({ type: 'array', minItems: 2 }), { f: [1] })).toEqual(['/f: must list at least 2 item(s)']);
    expect(issuesFor(field({ type: 'array', uniqueItems: true }), { f: ['a', 'b', 'a'] })).toEqual([
      '/f: must not repeat an item (items 0 and 2 are the same)',
    ]);
  });

  test.each([
    ['integer', 'x', '/f: must be an integer, got "x"'],
    ['object', [1], '/f: must be an object, got an array'],
    ['array', { a: 1 }, '/f: must be an array, got an object'],
    ['number', null, '/f: must be a number, got null'],
    ['boolean', 1, '/f: must be a boolean, got 1'],
  ])('type %s, given %j: %s (article by the first letter)', (type, data, expected) => {
    expect(issuesFor(field({ type }), { f: data })).toEqual([expected]);
  });

  test('a received string is quoted and cut after 40 characters', () => {
    const forty = 'a'.repeat(40);
    expect(issuesFor(field({ enum: ['x'] }), { f: forty })).toEqual([`/f: must be one of x, got "${forty}"`]);
    expect(issuesFor(field({ enum: ['x'] }), { f: `${forty}b` })).toEqual([`/f: must be one of x, got "${forty}…"`]);
  });

  test('const names the one value allowed', () => {
    expect(issuesFor(field({ const: 'npn' }), { f: 'pnp' })).toEqual(['/f: must be "npn", got "pnp"']);
  });

  test('the same problem reached through two branches is said once', () => {
    const schema = field({ anyOf: [{ type: 'string' }, { type: 'string', minLength: 1 }] });
    expect(issuesFor(schema, { f: 3 })).toEqual(['/f: must be a string, got 3']);
  });
});

describe('issuesFromAjvErrors: units and ranges', () => {
  test.each([
    ['V', 'V'],
    ['Ω', 'Ω'],
    ['ohm', 'Ω'],
  ])('x-unit %s prints as %s after the limit and the value', (unit, printedUnit) => {
    expect(issuesFor(field({ type: 'number', minimum: 10, 'x-unit': unit }), { f: 5 })).toEqual([
      `/f: must be >= 10 ${printedUnit}, got 5 ${printedUnit}`,
    ]);
  });

  test('a dimensionless unit ("1") and no unit print the bare numbers', () => {
    expect(issuesFor(field({ type: 'number', maximum: 1, 'x-unit': '1' }), { f: 2 })).toEqual(['/f: must be <= 1, got 2']);
    expect(issuesFor(field({ type: 'number', exclusiveMaximum: 1 }), { f: 1 })).toEqual(['/f: must be < 1, got 1']);
    expect(issuesFor(field({ type: 'number', exclusiveMinimum: 0 }), { f: 0 })).toEqual(['/f: must be > 0, got 0']);
  });

  test('without verbose errors (no parent schema) a range still reads, without a unit', () => {
    expect(issuesFor(field({ type: 'number', minimum: 10, 'x-unit': 'V' }), { f: 5 }, { verbose: false })).toEqual([
      '/f: must be >= 10, got undefined',
    ]);
  });

  test('`not` of an open interval names it; any other `not` is "not an allowed value"', () => {
    const interval = field({ type: 'number', 'x-unit': 'V', not: { exclusiveMinimum: 0, exclusiveMaximum: 1 } });
    expect(issuesFor(interval, { f: 0.5 })).toEqual(['/f: must not be strictly between 0 and 1 V, got 0.5 V']);
    const halfOpen = field({ type: 'number', not: { exclusiveMinimum: 0 } });
    expect(issuesFor(halfOpen, { f: 0.5 })).toEqual(['/f: is not an allowed value']);
    const upperOnly = field({ type: 'number', not: { exclusiveMaximum: 1 } });
    expect(issuesFor(upperOnly, { f: 0.5 })).toEqual(['/f: is not an allowed value']);
  });

  test('a keyword without its own wording keeps ajv\u2019s message, or "is not valid" when ajv gives none', () => {
    expect(issuesFor(field({ type: 'number', multipleOf: 5 }), { f: 7 })).toEqual(['/f: must be multiple of 5']);
    expect(issuesFor(field({ type: 'number', multipleOf: 5 }), { f: 7 }, { messages: false })).toEqual(['/f: is not valid']);
  });
});

describe('issuesFromAjvErrors: patterns', () => {
  // Code points and names from the Unicode character database: U+0009 CHARACTER TABULATION,
  // U+000D CARRIAGE RETURN, U+0007 BELL (a C0 control without a name of its own here).
  test('single-line text: a tab is named with its position', () => {
    expect(issuesFor(field({ type: 'string', pattern: PLAIN_LINE_PATTERN }), { f: 'ab\tc' })).toEqual([
      '/f: must not contain U+0009 (tab) (character 3): one line of text; no line breaks, tabs or other control characters, and no bidirectional overrides',
    ]);
  });

  test('multi-line text: LF passes, CR is refused with the multi-line wording', () => {
    const schema = field({ type: 'string', pattern: PLAIN_LINES_PATTERN });
    expect(issuesFor({ ...schema, required: ['g'] }, { f: 'one\ntwo' })).toEqual(['/g: is required']);
    expect(issuesFor(schema, { f: 'one\r\ntwo' })).toEqual([
      '/f: must not contain U+000D (carriage return) (character 4): line breaks as LF only; no other control characters, and no bidirectional overrides',
    ]);
  });

  test('a name: blanks alone are "blank", a control character is named', () => {
    const schema = field({ type: 'string', pattern: PLAIN_NAME_PATTERN });
    expect(issuesFor(schema, { f: '   ' })).toEqual(['/f: must not be blank']);
    expect(issuesFor(schema, { f: 'a\u0007' })).toEqual([
      '/f: must not contain U+0007 (control character) (character 2): one line of text; no line breaks, tabs or other control characters, and no bidirectional overrides',
    ]);
  });

  test('the plain "\\S" pattern is "blank"; any other pattern "not in the expected format"', () => {
    expect(issuesFor(field({ type: 'string', pattern: '\\S' }), { f: '  ' })).toEqual(['/f: must not be blank']);
    expect(issuesFor(field({ type: 'string', pattern: '^[0-9a-f]{64}$' }), { f: 'a\tb' })).toEqual(['/f: is not in the expected format']);
  });
});

describe('issuesFromAjvErrors: paths', () => {
  // RFC 6901 section 3/4: "~" is written "~0" and "/" is written "~1" in a JSON pointer
  test('a missing or unknown property with "/" or "~" in its name gets an escaped pointer [RFC6901]', () => {
    expect(issuesFor({ type: 'object', required: ['a/b'] }, {})).toEqual(['/a~1b: is required']);
    expect(issuesFor({ type: 'object', additionalProperties: false }, { 'x~y': 1 })).toEqual([
      '/x~0y: is not a known field here (remove it or check its spelling)',
    ]);
    expect(pointerSegment('~1/')).toBe('~01~1');
  });

  test('a discriminated oneOf with an unknown tag lists the tags; a missing tag is left to `required`', () => {
    const schema: SchemaObject = {
      type: 'object',
      discriminator: { propertyName: 'kind' },
      required: ['kind'],
      oneOf: [
        { properties: { kind: { const: 'resistor' } } },
        { properties: { kind: { const: 'widlar' } } },
      ],
    };
    expect(issuesFor(schema, { kind: 'diode' })).toEqual(['/kind: must be one of resistor, widlar, got "diode"']);
    expect(issuesFor(schema, {})).toEqual(['/kind: is required']);
  });
});
