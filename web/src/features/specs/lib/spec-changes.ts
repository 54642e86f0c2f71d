/**
 * The server's field-by-field changes between two spec versions, made readable: each path
 * labelled with the form's words ("Supply › Negative rail"), values formatted with their units,
 * whole lists (the tail options) compared as one row, whole objects spread into their fields.
 */
import type { JsonChange } from '#shared/json-diff';
import { formatQuantity } from '#shared/units/format-quantity';
import { pointerSegments, schemaAt, type SchemaNode } from './schema-nodes';
import { ENUM_WORDS, SPEC_LAYOUT } from './spec-ui-schema';

export interface ReadableChange {
  path: string;
  label: string;
  kind: JsonChange['kind'];
  before: string;
  after: string;
  /** For lists: what was left out and what was added, in words. */
  detail?: string;
}

const NOT_SET = 'not set';
const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** The card a top-level property sits in, for the first words of its label. */
function cardTitle(name: string): string | undefined {
  if (SPEC_LAYOUT.lead.includes(name)) return undefined;
  return SPEC_LAYOUT.cards.find((c) => c.fields.includes(name))?.title;
}

/** "Supply › Negative rail": the card, then the schema titles down to the field. */
export function pathLabel(schema: SchemaNode, segments: readonly string[]): string {
  const words: string[] = [];
  const card = segments.length > 0 ? cardTitle(segments[0]) : undefined;
  if (card) words.push(card);
  segments.forEach((segment, i) => {
    const node = schemaAt(schema, segments.slice(0, i + 1));
    const parent = schemaAt(schema, segments.slice(0, i));
    if (parent?.type === 'array') words.push(`item ${Number(segment) + 1}`);
    else if (i === 0 && node?.type === 'object' && card) return; // the card already names it
    else words.push(typeof node?.title === 'string' ? node.title : segment);
  });
  return words.join(' › ') || 'Whole spec';
}

/** One value in words: a quantity with its unit, an enum value by name, yes/no, a list. */
export function formatValue(value: unknown, node: SchemaNode | undefined, name: string): string {
  if (value === undefined || value === null) return NOT_SET;
  if (Array.isArray(value)) return value.length === 0 ? 'none' : value.map((v) => formatValue(v, schemaOfItems(node), name)).join(', ');
  if (typeof value === 'boolean') return value ? 'Yes' : 'No';
  if (typeof value === 'number') {
    const unit = node?.['x-unit'];
    return typeof unit === 'string' ? formatQuantity(value, unit, 6) : String(value);
  }
  if (typeof value === 'string') return ENUM_WORDS[name]?.[value] ?? value;
  return JSON.stringify(value);
}

function schemaOfItems(node: SchemaNode | undefined): SchemaNode | undefined {
  return isObject(node?.items) ? (node.items as SchemaNode) : undefined;
}

function valueAt(document: unknown, segments: readonly string[]): unknown {
  return segments.reduce<unknown>((v, s) => (isObject(v) || Array.isArray(v) ? (v as Record<string, unknown>)[s] : undefined), document);
}

/** Leaf changes only: an object added or removed as a whole becomes one change per field. */
function spread(change: JsonChange): JsonChange[] {
  const value = change.kind === 'removed' ? change.before : change.after;
  if (change.kind === 'changed' || !isObject(value)) return [change];
  return Object.entries(value).flatMap(([key, inner]) =>
    spread({ path: `${change.path}/${key}`, kind: change.kind, ...(change.kind === 'removed' ? { before: inner } : { after: inner }) }),
  );
}

/** "Wilson mirror left out; Cascode mirror added": the members a list lost and gained. */
function listDetail(before: unknown, after: unknown, node: SchemaNode | undefined, name: string): string | undefined {
  if (!Array.isArray(before) || !Array.isArray(after)) return undefined;
  const items = schemaOfItems(node);
  const words = (values: unknown[]) => values.map((v) => formatValue(v, items, name)).join(', ');
  const lost = before.filter((v) => !after.includes(v));
  const gained = after.filter((v) => !before.includes(v));
  const parts = [lost.length > 0 && `${words(lost)} left out`, gained.length > 0 && `${words(gained)} added`].filter(Boolean);
  return parts.length > 0 ? parts.join('; ') : 'same members, new order';
}

/** Where a path sits in the form: its card's place in the layout, then the schema's property order. */
function formOrder(schema: SchemaNode, segments: readonly string[]): number[] {
  const top = [...SPEC_LAYOUT.lead, ...SPEC_LAYOUT.cards.flatMap((c) => c.fields)].indexOf(segments[0] ?? '');
  const rest = segments.slice(1).map((segment, i) => {
    const properties = schemaAt(schema, segments.slice(0, i + 1))?.properties;
    const index = properties && typeof properties === 'object' ? Object.keys(properties).indexOf(segment) : Number(segment);
    return index < 0 ? Number.MAX_SAFE_INTEGER : index;
  });
  return [top < 0 ? Number.MAX_SAFE_INTEGER : top, ...rest];
}

function compareOrder(a: number[], b: number[]): number {
  for (let i = 0; i < Math.max(a.length, b.length); i++) {
    const d = (a[i] ?? -1) - (b[i] ?? -1);
    if (d !== 0) return d;
  }
  return 0;
}

/**
 * The readable rows for `changes` between the documents `from` and `to`. Changes inside a
 * list collapse into one row for the list, shown whole before and after.
 */
export function readableChanges(schema: SchemaNode, changes: readonly JsonChange[], from: unknown, to: unknown): ReadableChange[] {
  const rows = new Map<string, ReadableChange & { order: number[] }>();
  for (const change of changes.flatMap(spread)) {
    let segments = pointerSegments(change.path);
    const listAt = segments.findIndex((_, i) => schemaAt(schema, segments.slice(0, i + 1))?.type === 'array');
    if (listAt >= 0) segments = segments.slice(0, listAt + 1);
    const path = `/${segments.join('/')}`;
    if (rows.has(path)) continue;
    const node = schemaAt(schema, segments);
    const name = segments[segments.length - 1] ?? '';
    const before = listAt >= 0 ? valueAt(from, segments) : change.before;
    const after = listAt >= 0 ? valueAt(to, segments) : change.after;
    const kind: JsonChange['kind'] = before === undefined ? 'added' : after === undefined ? 'removed' : 'changed';
    const detail = listAt >= 0 && kind === 'changed' ? listDetail(before, after, node, name) : undefined;
    rows.set(path, {
      path,
      label: pathLabel(schema, segments),
      kind,
      before: formatValue(before, node, name),
      after: formatValue(after, node, name),
      ...(detail ? { detail } : {}),
      order: formOrder(schema, segments),
    });
  }
  return [...rows.values()].sort((a, b) => compareOrder(a.order, b.order)).map(({ order: _order, ...row }) => row);
}
