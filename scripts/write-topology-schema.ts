/**
 * Writes the topology parts of shared/schema/design.schema.json (the tail branches) and
 * spec.schema.json (the tail options), and docs/tail-topologies.md, from the catalogue,
 * shared/engine/topologies.ts, and both schemas' `device.model` part from the Gummel-Poon
 * parameter list, shared/engine/bjt-parameters.ts (`npm run generate:topologies`, which then recompiles the spec
 * form's validators and rewrites the CSV column table); topology-schema.test.ts fails until you
 * do. Every other part of the two schema files is kept as it is (numbers are rewritten in
 * JSON.stringify's notation, same values).
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { ROUT_FORMULAS } from '#shared/engine/closed-form';
import { TOPOLOGIES, TOPOLOGY_CATALOGUE, type DeviceFamily, type RoutLimit } from '#shared/engine/topologies';
import { designSchemaWithDeviceModel, specSchemaWithDeviceModel } from '#shared/schema/device-model-schema';
import { designSchemaWithTopologies, specSchemaWithTopologies } from '#shared/schema/topology-schema';

export const DESIGN_SCHEMA_PATH = fileURLToPath(new URL('../shared/schema/design.schema.json', import.meta.url));
export const SPEC_SCHEMA_PATH = fileURLToPath(new URL('../shared/schema/spec.schema.json', import.meta.url));
export const TOPOLOGIES_DOC_PATH = fileURLToPath(new URL('../docs/tail-topologies.md', import.meta.url));

const FAMILY_WORDS: Record<DeviceFamily, string> = { npn: 'NPN bipolar', pnp: 'PNP bipolar' };

function routWords(limit: RoutLimit): string {
  return limit.form === 'resistor' ? ROUT_FORMULAS[limit.form] : `${ROUT_FORMULAS[limit.form]} of ${limit.transistor}`;
}

/** docs/tail-topologies.md: the catalogue as a table (a test keeps the file current). */
export function tailTopologiesMarkdown(): string {
  const lines = [
    '# Tail topologies',
    '',
    '<!-- Generated from shared/engine/topologies.ts by `npm run generate:topologies`; do not edit by hand. -->',
    '',
    'The tail options Longtail sizes and compares, in order of simplicity (the order the "simplest',
    'sufficient" policy walks). A spec lists the ones to compare by id in `topologies` (in JSON, or',
    'the `topologies` column of a spec CSV); a design names its own in `tail.topology`, with the',
    'values of the fields below in ohms. Part names are those of the schematic and the exported',
    'SPICE netlist. The textbook output resistance is quoted beside the node solution in the',
    'reasons; every figure is an estimate to confirm by simulation and bench measurement.',
    '',
    'Each tail is drawn here for an NPN pair. A PNP pair (`device.family` "pnp") takes the mirror',
    'image of every tail that needs no second device: PNP transistors, the tail element from `t` to',
    'the positive rail, reference resistors and loads to the negative rail.',
    '',
    '| Id | Name | Family | Circuit, from `t` to the negative rail | Resistors (design field) | Area ratios (design field) | Transistors | Textbook Rout |',
    '|---|---|---|---|---|---|---|---|',
  ];
  for (const id of TOPOLOGIES) {
    const entry = TOPOLOGY_CATALOGUE[id];
    const resistors = entry.resistors.map((r) => `${r.names.join(', ')}: ${r.role} (\`${r.field}\`)`).join('<br>');
    const ratios = entry.ratios.map((r) => `${r.role} (\`${r.field}\`${r.default !== undefined ? `, default ${r.default}` : ''})`).join('<br>') || '—';
    const transistors = entry.transistors.map((q) => `${q.name}${q.type ? ` (${q.type.toUpperCase()})` : ''}: ${q.role}`).join('<br>') || '—';
    const family = entry.needsDevice ? `${FAMILY_WORDS[entry.family]} (needs \`device.${entry.needsDevice}\`)` : FAMILY_WORDS[entry.family];
    const circuit = entry.circuitWords.replace(/\{(\w+)\}/g, '`$1`');
    lines.push(`| \`${id}\` | ${entry.name} | ${family} | ${circuit} | ${resistors} | ${ratios} | ${transistors} | ${routWords(entry.routLimit)} |`);
  }
  return `${lines.join('\n')}\n`;
}

function rewrite(path: string, build: (schema: Record<string, unknown>) => Record<string, unknown>): void {
  const schema = JSON.parse(readFileSync(path, 'utf8')) as Record<string, unknown>;
  writeFileSync(path, `${JSON.stringify(build(schema), null, 2)}\n`);
  console.log(`Wrote ${path}`);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  rewrite(DESIGN_SCHEMA_PATH, (schema) => designSchemaWithDeviceModel(designSchemaWithTopologies(schema)));
  rewrite(SPEC_SCHEMA_PATH, (schema) => specSchemaWithDeviceModel(specSchemaWithTopologies(schema)));
  writeFileSync(TOPOLOGIES_DOC_PATH, tailTopologiesMarkdown());
  console.log(`Wrote ${TOPOLOGIES_DOC_PATH}`);
}
