/**
 * What the search knows of each kind of record: a title and lines of text, written as a person
 * reads them, so a hit's excerpt is one of these lines with the words marked. A spec's lines are
 * its fields with their values and units as the forms print them ("Minimum CMRR: 80 dB",
 * "Saturation current IS: 8.2 fA"), so "80 dB" finds it. Pure: the index service feeds it rows.
 */
import { SPEC_CSV_COLUMNS, type SpecColumn } from '#shared/import/spec-columns';
import { topologyName } from '#shared/engine/topologies';
import { formatQuantity } from '#shared/units/format-quantity';
import { STATE_WORDS, type ProposalState } from '#shared/workflow/proposal-states';
import { SPEC_SCHEMA } from '#shared/validate';

/** A record as the search reads it. */
export interface SearchDocument {
  title: string;
  lines: string[];
}

/** Significant digits of a spec value, as the version history prints them. */
const VALUE_DIGITS = 6;
/** Fields left out: the title is the document's title; a checksum is no word anyone types. */
const LEFT_OUT = new Set(['title', 'deviceModel.checksum']);
const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** The schema title of the object holding a field nested two deep or more ("SPICE model card" for device.model.IS), else null. */
function holderTitle(column: SpecColumn): string | null {
  if (column.path.length < 3) return null;
  let node: unknown = SPEC_SCHEMA;
  for (const key of column.path.slice(0, -1)) node = isObject(node) && isObject(node.properties) ? node.properties[key] : undefined;
  return isObject(node) && typeof node.title === 'string' ? node.title : null;
}

const SPEC_FIELDS = SPEC_CSV_COLUMNS.filter((column) => !LEFT_OUT.has(column.name)).map((column) => {
  const holder = holderTitle(column);
  return { column, label: holder ? `${holder} › ${column.title}` : column.title };
});

function valueAt(document: unknown, path: readonly string[]): unknown {
  return path.reduce<unknown>((value, key) => (isObject(value) ? value[key] : undefined), document);
}

/** One value in words: a quantity with its unit, a tail option by its name, yes or no, a word as written. */
function valueText(value: unknown, column: SpecColumn): string | null {
  if (typeof value === 'number' && Number.isFinite(value)) return column.unit ? formatQuantity(value, column.unit, VALUE_DIGITS) : String(value);
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string') return value;
  if (Array.isArray(value)) return column.name === 'topologies' ? value.map((v) => topologyName(String(v))).join(', ') : value.map(String).join(', ');
  return null;
}

/** A spec as its latest version reads: title, version and note, then every field it gives. */
export function specDocument(spec: { title: string; version: number; note: string | null; payload: unknown }): SearchDocument {
  const lines = [`Version ${spec.version}`];
  if (spec.note) lines.push(`Note: ${spec.note}`);
  for (const { column, label } of SPEC_FIELDS) {
    const text = valueText(valueAt(spec.payload, column.path), column);
    if (text !== null && text !== '') lines.push(`${label}: ${text}`);
  }
  return { title: spec.title, lines };
}

/** A proposal: its number and spec version, its state in the app's words, what the engine recommended and what was decided. */
export function proposalDocument(proposal: {
  id: number;
  specTitle: string;
  specVersion: number;
  status: ProposalState;
  recommendedTopology: string | null;
  decidedTopology: string | null;
}): SearchDocument {
  const lines = [
    `Proposal ${proposal.id} of spec version ${proposal.specVersion}`,
    `State: ${STATE_WORDS[proposal.status] ?? proposal.status} (${proposal.status})`,
    `Recommended: ${proposal.recommendedTopology ? topologyName(proposal.recommendedTopology) : 'no option passes'}`,
  ];
  if (proposal.decidedTopology) lines.push(`Decided design: ${topologyName(proposal.decidedTopology)}`);
  return { title: `#${proposal.id} ${proposal.specTitle}`, lines };
}

/** A project: its name and description. */
export function projectDocument(project: { name: string; description: string }): SearchDocument {
  return { title: project.name, lines: project.description.split('\n').filter((line) => line.trim() !== '') };
}

/** A person: the name and the e-mail address (as the members list shows them). */
export function personDocument(person: { displayName: string; email: string }): SearchDocument {
  return { title: person.displayName, lines: [`E-mail: ${person.email}`] };
}
