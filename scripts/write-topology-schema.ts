/**
 * Writes the topology parts of shared/schema/design.schema.json (the tail branches) and
 * spec.schema.json (the tail options) from the catalogue, shared/engine/topologies.ts
 * (`npm run generate:topologies`, which then recompiles the spec form's validators and rewrites
 * the CSV column table); topology-schema.test.ts fails until you do. Every other part of the two
 * files is kept as it is (numbers are rewritten in JSON.stringify's notation, same values).
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { designSchemaWithTopologies, specSchemaWithTopologies } from '../shared/schema/topology-schema';

export const DESIGN_SCHEMA_PATH = fileURLToPath(new URL('../shared/schema/design.schema.json', import.meta.url));
export const SPEC_SCHEMA_PATH = fileURLToPath(new URL('../shared/schema/spec.schema.json', import.meta.url));

function rewrite(path: string, build: (schema: Record<string, unknown>) => Record<string, unknown>): void {
  const schema = JSON.parse(readFileSync(path, 'utf8')) as Record<string, unknown>;
  writeFileSync(path, `${JSON.stringify(build(schema), null, 2)}\n`);
  console.log(`Wrote ${path}`);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  rewrite(DESIGN_SCHEMA_PATH, designSchemaWithTopologies);
  rewrite(SPEC_SCHEMA_PATH, specSchemaWithTopologies);
}
