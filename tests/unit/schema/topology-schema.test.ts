import { readFileSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import { TOPOLOGIES, TOPOLOGY_CATALOGUE } from '#shared/engine/topologies';
import { designSchemaWithTopologies, specSchemaWithTopologies } from '#shared/schema/topology-schema';
import { DESIGN_SCHEMA_PATH, SPEC_SCHEMA_PATH, TOPOLOGIES_DOC_PATH, tailTopologiesMarkdown } from '../../../scripts/write-topology-schema';

type Node = Record<string, unknown> & { properties?: Record<string, Node>; oneOf?: Node[]; items?: Node };

const fromFile = (path: string) => JSON.parse(readFileSync(path, 'utf8')) as Node;
const drift = 'shared/schema drifted from shared/engine/topologies.ts: run `npm run generate:topologies`';

describe('the schemas follow the topology catalogue', () => {
  test("the design schema's tail branches are the catalogue's: id, title, fields and their limits", () => {
    const file = fromFile(DESIGN_SCHEMA_PATH);
    expect(file, drift).toEqual(designSchemaWithTopologies(file));
  });

  test("the spec schema's tail options are the catalogue's ids, all chosen by default", () => {
    const file = fromFile(SPEC_SCHEMA_PATH);
    expect(file, drift).toEqual(specSchemaWithTopologies(file));
  });

  test('each tail branch is titled with the name the app shows for its topology, in simplicity order', () => {
    const branches = fromFile(DESIGN_SCHEMA_PATH).properties!.tail.oneOf!;
    expect(branches.map((b) => [b.properties!.topology.const, b.title])).toEqual(TOPOLOGIES.map((id) => [id, TOPOLOGY_CATALOGUE[id].name]));
  });

  test("each branch's fields are the values of the topology's resistors, then its area ratios (those with a default not required)", () => {
    const branches = fromFile(DESIGN_SCHEMA_PATH).properties!.tail.oneOf!;
    for (const branch of branches) {
      const id = branch.properties!.topology.const as (typeof TOPOLOGIES)[number];
      const fields = Object.keys(branch.properties!).filter((name) => name !== 'topology');
      const resistors = [...new Set(TOPOLOGY_CATALOGUE[id].resistors.map((r) => r.field))];
      const ratios = TOPOLOGY_CATALOGUE[id].ratios;
      expect(fields, id).toEqual([...resistors, ...ratios.map((r) => r.field)]);
      expect(branch.required, id).toEqual(['topology', ...resistors, ...ratios.filter((r) => r.default === undefined).map((r) => r.field)]);
      for (const ratio of ratios) expect((branch.properties![ratio.field] as { default?: number }).default, `${id} ${ratio.field}`).toBe(ratio.default);
    }
  });

  test('docs/tail-topologies.md is the catalogue as it stands', () => {
    expect(readFileSync(TOPOLOGIES_DOC_PATH, 'utf8'), 'docs/tail-topologies.md drifted: run `npm run generate:topologies`').toBe(tailTopologiesMarkdown());
  });
});
