/**
 * Request schemas written against their wire shapes (shared/api): `wire<Shape>()(properties,
 * required)` is a strict object schema (unknown fields refused) whose fields are exactly the
 * shape's, whose `required` list is exactly the shape's required fields, each field schema fitting
 * the field's type (an enum of exactly its values, or string / number / boolean). A schema and a
 * shape that drift apart are a compile error naming what differs.
 */

/** The field schema that fits a field of type `V`: an enum of exactly its values, or its JSON type. */
type FieldSchemaOf<V> = [V] extends [boolean]
  ? { type: 'boolean' }
  : [V] extends [number]
    ? { type: 'integer' | 'number' }
    : [V] extends [string]
      ? string extends V
        ? { type: 'string' }
        : { enum: readonly V[] }
      : object;
/** The fields `T` must have (not `?:`). */
type RequiredFields<T> = { [K in keyof T]-?: object extends Pick<T, K> ? never : K }[keyof T];
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
/** The fields whose enum lists other values than the field's type allows (some of them, or more). */
type EnumsDiffering<P, T> = { [K in keyof P & keyof T]: P[K] extends { enum: readonly (infer E)[] } ? (Same<E, NonNullable<T[K]>> extends true ? never : K) : never }[keyof P & keyof T];

/**
 * A strict object schema checked against the wire shape `T` (see the head of this file): pass the
 * field schemas and the required fields; a mismatch is a compile error naming what differs.
 */
export function wire<T>() {
  return <const P extends { [K in keyof T]-?: FieldSchemaOf<NonNullable<T[K]>> }, const R extends readonly RequiredFields<T>[]>(
    properties: P &
      (Same<keyof P, keyof T> extends true ? unknown : { fieldsNotInTheShape: Exclude<keyof P, keyof T> }) &
      ([EnumsDiffering<P, T>] extends [never] ? unknown : { enumValuesDiffer: EnumsDiffering<P, T> }),
    required: R & (Same<R[number], RequiredFields<T>> extends true ? unknown : { requiredMissing: Exclude<RequiredFields<T>, R[number]> }),
  ) => ({ type: 'object' as const, additionalProperties: false as const, properties: properties as P, required: [...required] as string[] });
}

/** `T` with the fields `K` optional: a query's defaulted fields, which the query string may leave out. */
export type Defaulted<T, K extends keyof T> = Omit<T, K> & Partial<Pick<T, K>>;
