/**
 * A spec version's document as the report prints it: the form's cards as groups, each field with
 * the schema's title and its value in engineering notation with the unit (the same words and
 * formatting as the version history). Pure.
 */
import specSchema from '#shared/schema/spec.schema.json';
import type { Spec } from '#shared/engine/types';
import { formatTolerance } from '#shared/units/figures';
import { formatValue } from './spec-changes';
import { propertySchema, type SchemaNode } from './schema-nodes';
import { SPEC_LAYOUT } from './spec-ui-schema';

export interface SpecRow {
  /** JSON path, e.g. "/supply/negativeV". */
  path: string;
  label: string;
  value: string;
}

export interface SpecGroup {
  title: string;
  rows: SpecRow[];
}

const SCHEMA = specSchema as unknown as SchemaNode;
const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** One value in words; a tolerance given as a fraction reads as "±1 %", a count or seed as a whole number. */
function valueText(value: unknown, node: SchemaNode | undefined, name: string): string {
  if (typeof value === 'number' && node?.['x-unit'] === '1') {
    if (name === 'tolerance') return formatTolerance(Number((value * 100).toPrecision(6)), '%');
    if (node.type === 'integer') return String(value);
  }
  return formatValue(value, node, name);
}

function titleOf(node: SchemaNode | undefined, fallback: string): string {
  return typeof node?.title === 'string' ? node.title : fallback;
}

/**
 * The rows of one top-level field: its own row, or one row per property of an object, in schema
 * order; an object inside it that the document gives (the PNP transistor, a model card) as one
 * row per value it holds, never as JSON.
 */
function fieldRows(document: Record<string, unknown>, name: string): SpecRow[] {
  const node = propertySchema(SCHEMA, name);
  const value = document[name];
  if (node?.type === 'object' && isObject(node.properties)) {
    const inner = isObject(value) ? value : {};
    const names = [...Object.keys(node.properties), ...Object.keys(inner).filter((k) => !(k in (node.properties as object)))];
    return names.flatMap((key) => {
      const child = propertySchema(node, key);
      const given = inner[key];
      if (child?.type === 'object' && isObject(given)) {
        return Object.entries(given)
          .filter(([, v]) => v !== undefined)
          .map(([sub, v]) => ({ path: `/${name}/${key}/${sub}`, label: titleOf(propertySchema(child, sub), sub), value: valueText(v, propertySchema(child, sub), sub) }));
      }
      return [{ path: `/${name}/${key}`, label: titleOf(child, key), value: valueText(given, child, key) }];
    });
  }
  return [{ path: `/${name}`, label: titleOf(node, name), value: valueText(value, node, name) }];
}

/** The document in the form's order; fields the layout does not place come last, under "Other". */
export function specGroups(document: Spec | Record<string, unknown>): SpecGroup[] {
  const doc = document as Record<string, unknown>;
  const placed = new Set([...SPEC_LAYOUT.lead, ...SPEC_LAYOUT.cards.flatMap((c) => c.fields)]);
  const groups: SpecGroup[] = [{ title: 'Spec', rows: SPEC_LAYOUT.lead.flatMap((name) => fieldRows(doc, name)) }];
  for (const card of SPEC_LAYOUT.cards) groups.push({ title: card.title, rows: card.fields.flatMap((name) => fieldRows(doc, name)) });
  const others = Object.keys(doc).filter((name) => !placed.has(name));
  if (others.length > 0) groups.push({ title: 'Other', rows: others.flatMap((name) => fieldRows(doc, name)) });
  return groups.filter((g) => g.rows.length > 0);
}
