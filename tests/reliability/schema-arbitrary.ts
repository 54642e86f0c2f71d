/**
 * fast-check arbitraries from the JSON Schemas (draft-07) the routes validate against
 * (api/validation/bodies.ts, shared/schema/*.json): the keywords those schemas use — type,
 * properties/required/additionalProperties, enum, const, oneOf/anyOf, $ref, min/max (and the
 * exclusive forms), minLength/maxLength, pattern, items/minItems/maxItems/uniqueItems,
 * minProperties, `not` of a numeric range, and an `if` whose `then` only adds required keys (those
 * keys are then always generated, which satisfies the condition either way). Other `not` and `if` forms are ignored, so values
 * may break them (the server must answer those with a 4xx, never a 5xx). Integer ranges are cut to 1000 above their minimum, so a
 * generated spec's Monte Carlo sample count keeps an engine run short.
 *
 * hostile(arb) mixes schema-valid values with mutated ones (a field dropped, replaced by any
 * JSON value, or an unknown field added) and arbitrary JSON.
 */
import fc from 'fast-check';

type Schema = Record<string, unknown>;

/** Text of every kind: printable ASCII, any code point, and graphemes. */
function text(minLength: number, maxLength: number): fc.Arbitrary<string> {
  const max = Math.min(maxLength, minLength + 80);
  return fc.oneof(
    fc.string({ minLength, maxLength: max }),
    fc.string({ minLength, maxLength: max, unit: 'binary' }),
    fc.string({ minLength, maxLength: max, unit: 'grapheme' }),
    // Sometimes exactly at the limit
    fc.string({ minLength: maxLength === Infinity ? minLength : maxLength, maxLength: maxLength === Infinity ? minLength + 1 : maxLength, unit: 'grapheme-ascii' }),
  );
}

export function arbitraryFromSchema(schema: Schema, root: Schema = schema, depth = 0): fc.Arbitrary<unknown> {
  if (depth > 12) return fc.constant(null);
  const next = (s: unknown) => arbitraryFromSchema(s as Schema, root, depth + 1);
  if (typeof schema.$ref === 'string') {
    const path = schema.$ref.replace(/^#\//, '').split('/');
    let target: unknown = root;
    for (const key of path) target = (target as Schema)[key];
    return next(target);
  }
  if ('const' in schema) return fc.constant(schema.const);
  if (Array.isArray(schema.enum)) return fc.constantFrom(...(schema.enum as unknown[]));
  const choices = (schema.oneOf ?? schema.anyOf) as Schema[] | undefined;
  if (choices) {
    // Sibling keywords (e.g. a shared type/properties) apply to every branch
    const { oneOf: _o, anyOf: _a, ...rest } = schema;
    return fc.oneof(...choices.map((choice) => next(mergeSchemas(rest, choice))));
  }
  const type = schema.type ?? (schema.properties ? 'object' : undefined);
  if (Array.isArray(type)) return fc.oneof(...type.map((t) => next({ ...schema, type: t })));
  switch (type) {
    case 'object': {
      const properties = (schema.properties ?? {}) as Record<string, Schema>;
      const thenRequired = schema.if && schema.then ? (((schema.then as Schema).required ?? []) as string[]) : [];
      const required = [...((schema.required ?? []) as string[]), ...thenRequired];
      const model: Record<string, fc.Arbitrary<unknown>> = {};
      for (const [key, sub] of Object.entries(properties)) model[key] = next(sub);
      const minProperties = (schema.minProperties as number | undefined) ?? 0;
      const record = fc.record(model, { requiredKeys: required.filter((k) => k in model) }).filter((value) => Object.keys(value).length >= minProperties);
      if (schema.additionalProperties === false || Object.keys(properties).length > 0) return record;
      return fc.dictionary(fc.string({ maxLength: 12 }), fc.jsonValue({ maxDepth: 2 }), { maxKeys: 4 });
    }
    case 'string': {
      const min = (schema.minLength as number | undefined) ?? 0;
      const max = (schema.maxLength as number | undefined) ?? Infinity;
      if (typeof schema.pattern === 'string') {
        const pattern = new RegExp(schema.pattern);
        const matching = fc.stringMatching(pattern).filter((s) => s.length >= min && s.length <= max);
        // An anchored pattern (a checksum) is almost never met by chance: generate from it alone
        return schema.pattern.startsWith('^') ? matching : fc.oneof(matching, text(min, max).filter((s) => pattern.test(s)));
      }
      return text(min, max);
    }
    case 'integer': {
      const min = Math.ceil(Math.max(-1e6, (schema.minimum as number | undefined) ?? ((schema.exclusiveMinimum as number | undefined) ?? -1e6 - 1) + 1));
      const max = Math.floor(Math.min(min + 1000, (schema.maximum as number | undefined) ?? ((schema.exclusiveMaximum as number | undefined) ?? 1e6 + 1) - 1));
      return fc.integer({ min, max: Math.max(min, max) });
    }
    case 'number': {
      const min = (schema.minimum as number | undefined) ?? (schema.exclusiveMinimum as number | undefined) ?? -1e9;
      const max = (schema.maximum as number | undefined) ?? (schema.exclusiveMaximum as number | undefined) ?? 1e9;
      const numbers = fc.double({ min, max, noNaN: true, noDefaultInfinity: true, minExcluded: 'exclusiveMinimum' in schema, maxExcluded: 'exclusiveMaximum' in schema });
      // A `not` of a numeric range (the Early voltage's gap between 0 and 1 V): keep out of it
      const gap = schema.not as Schema | undefined;
      if (!gap) return numbers;
      const inGap = (v: number) =>
        (gap.exclusiveMinimum === undefined || v > (gap.exclusiveMinimum as number)) &&
        (gap.exclusiveMaximum === undefined || v < (gap.exclusiveMaximum as number)) &&
        (gap.minimum === undefined || v >= (gap.minimum as number)) &&
        (gap.maximum === undefined || v <= (gap.maximum as number));
      return numbers.map((v) => (inGap(v) ? ((gap.exclusiveMaximum ?? gap.maximum ?? max) as number) : v));
    }
    case 'boolean':
      return fc.boolean();
    case 'null':
      return fc.constant(null);
    case 'array': {
      const items = schema.items ? next(schema.items) : fc.jsonValue({ maxDepth: 1 });
      const minLength = (schema.minItems as number | undefined) ?? 0;
      const maxLength = Math.min((schema.maxItems as number | undefined) ?? minLength + 6, minLength + 6);
      return schema.uniqueItems ? fc.uniqueArray(items, { minLength, maxLength, selector: (v) => JSON.stringify(v) }) : fc.array(items, { minLength, maxLength });
    }
    default:
      return fc.jsonValue({ maxDepth: 2 });
  }
}

function mergeSchemas(base: Schema, branch: Schema): Schema {
  const merged: Schema = { ...base, ...branch };
  if (base.properties || branch.properties) merged.properties = { ...(base.properties as Schema), ...(branch.properties as Schema) };
  if (base.required || branch.required) merged.required = [...new Set([...((base.required as string[]) ?? []), ...((branch.required as string[]) ?? [])])];
  return merged;
}

/** Replaces, drops or adds one field somewhere in the first two levels of an object. */
function mutate([value, key, replacement, pick, action]: [unknown, string, unknown, number, number]): unknown {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) return replacement;
  const copy: Record<string, unknown> = { ...(value as Record<string, unknown>) };
  const keys = Object.keys(copy);
  if (keys.length === 0 || action === 0) {
    copy[key] = replacement;
    return copy;
  }
  const target = keys[pick % keys.length];
  const inner = copy[target];
  if (action === 1) delete copy[target];
  else if (action === 2 && inner !== null && typeof inner === 'object' && !Array.isArray(inner)) copy[target] = mutate([inner, key, replacement, pick >> 3, pick % 3]);
  else copy[target] = replacement;
  return copy;
}

/** Valid values (half), mutated ones, and arbitrary JSON. */
export function hostile(valid: fc.Arbitrary<unknown>): fc.Arbitrary<unknown> {
  const mutated = fc.tuple(valid, fc.string({ maxLength: 10 }), fc.jsonValue({ maxDepth: 2 }), fc.nat(), fc.integer({ min: 0, max: 3 })).map(mutate);
  return fc.oneof({ weight: 4, arbitrary: valid }, { weight: 3, arbitrary: mutated }, { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) });
}
