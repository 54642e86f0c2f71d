/**
 * Request schemas are held to their wire shapes by the compiler (api/validation/wire-schema.ts).
 * The `@ts-expect-error` lines below are schemas that drift from their shape: the type check
 * (`npx tsc --noEmit`, first step of `npm test`) fails if any of them stops being an error.
 */
import { describe, expect, test } from 'vitest';
import { wire } from '../../../api/validation/wire-schema';
import { compileValidator } from '#shared/validate';

interface Shape {
  kind: 'first' | 'second';
  count?: number;
  label: string;
  flag?: boolean;
}

const fields = { kind: { enum: ['first', 'second'] }, count: { type: 'integer' }, label: { type: 'string', maxLength: 8 }, flag: { type: 'boolean' } } as const;

describe('request schemas written against their wire shapes', () => {
  test('a schema that fits its shape is a strict JSON Schema object: unknown fields and missing required fields refused', () => {
    const schema = wire<Shape>()(fields, ['kind', 'label']);
    expect(schema).toEqual({ type: 'object', additionalProperties: false, properties: fields, required: ['kind', 'label'] });
    const check = compileValidator<Shape>(schema);
    expect(check({ kind: 'first', label: 'a' }).ok).toBe(true);
    expect(check({ kind: 'first', label: 'a', other: 1 }).ok).toBe(false);
    expect(check({ kind: 'first' }).ok).toBe(false);
  });

  test('schemas that drift from the shape do not compile', () => {
    const { kind, count, label, flag } = fields;
    const drifted = [
      // @ts-expect-error a field the shape does not have
      wire<Shape>()({ kind, count, label, flag, extra: { type: 'string' } }, ['kind', 'label']),
      // @ts-expect-error a field of the shape left out
      wire<Shape>()({ kind, label, flag }, ['kind', 'label']),
      // @ts-expect-error a required field not required
      wire<Shape>()(fields, ['kind']),
      // @ts-expect-error an optional field required
      wire<Shape>()(fields, ['kind', 'label', 'count']),
      // @ts-expect-error an enum value the shape does not allow
      wire<Shape>()({ kind: { enum: ['first', 'third'] }, count, label, flag }, ['kind', 'label']),
      // @ts-expect-error an enum missing a value the shape allows
      wire<Shape>()({ kind: { enum: ['first'] }, count, label, flag }, ['kind', 'label']),
      // @ts-expect-error a field schema of another JSON type
      wire<Shape>()({ kind, count: { type: 'string' }, label, flag }, ['kind', 'label']),
    ];
    // They still build a schema at run time; the guard is the type check.
    expect(drifted).toHaveLength(7);
  });
});
