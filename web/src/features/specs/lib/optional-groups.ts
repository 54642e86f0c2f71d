/**
 * The spec's optional groups (an object field without a default of its own: the noise, offset
 * and supply-rejection targets, the current-gain spread, the library record) as the form hands
 * them back. rjsf keeps a group nobody filled as `{}` or with keys holding `undefined`, and fills
 * a group's own defaults in (the offset's 3 sigmas) whether or not anything else was typed. A
 * group holding nothing but those is no target: it is left out, so what the form checks and saves
 * says "not checked" rather than asking for the rest of a target nobody set.
 */
import specSchema from '#shared/schema/spec.schema.json';
import { propertySchema, type SchemaNode } from './schema-nodes';

type Draft = Record<string, unknown>;

const SCHEMA = specSchema as unknown as SchemaNode;
const isRecord = (value: unknown): value is Draft => value !== null && typeof value === 'object' && !Array.isArray(value);

/** Top-level object fields that are neither required nor defaulted: absent means "none". */
export const OPTIONAL_GROUPS: readonly string[] = Object.entries((SCHEMA.properties ?? {}) as Record<string, SchemaNode>)
  .filter(([name, node]) => node.type === 'object' && node.default === undefined && !((SCHEMA.required ?? []) as string[]).includes(name))
  .map(([name]) => name);

/** Whether every value of the group is unset or its field's own default. */
function holdsNothing(group: Draft, node: SchemaNode | undefined): boolean {
  return Object.entries(group).every(([key, value]) => value === undefined || value === propertySchema(node, key)?.default);
}

/** The draft without the optional groups that hold nothing but unset values and defaults (the same object when there are none). */
export function withoutUnsetGroups<T extends Draft>(draft: T): T {
  const unset = OPTIONAL_GROUPS.filter((name) => isRecord(draft[name]) && holdsNothing(draft[name] as Draft, propertySchema(SCHEMA, name)));
  if (unset.length === 0) return draft;
  return Object.fromEntries(Object.entries(draft).filter(([name]) => !unset.includes(name))) as T;
}
