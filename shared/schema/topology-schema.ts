/**
 * The topology parts of the two schemas, built from the tail-topology catalogue
 * (shared/engine/topologies.ts): the design schema's tail branches (one per topology, titled with
 * its name, with its resistor fields) and the spec schema's list of tail options (every id, in
 * simplicity order, all chosen by default). `npm run generate:topologies` writes them into
 * design.schema.json and spec.schema.json; topology-schema.test.ts fails when the files drift.
 * Pure.
 */
import { TOPOLOGIES, TOPOLOGY_CATALOGUE, tailFieldsOf, type TailField, type TailRatioField, type TopologyId } from '../engine/topologies';

type SchemaNode = Record<string, unknown>;

/** The largest resistance any field allows, ohms (1 GΩ). */
const MAX_RESISTANCE_OHM = 1e9;
/** The smallest resistance any resistor field allows, ohms (1 mΩ, about a short copper trace: below it the part is a wire). */
const MIN_RESISTANCE_OHM = 1e-3;

/** The `topology` property of every tail branch; its `const` is the branch's id. */
const TOPOLOGY_PROPERTY = {
  type: 'string',
  title: 'Tail topology',
  description: 'Which tail element sits between the tail node and the negative rail.',
};

/** Each tail resistor field as the design schema states it: title, description, unit, usual range, limits. */
const TAIL_FIELD_SCHEMAS: Record<TailField, SchemaNode> = {
  resistanceOhm: {
    type: 'number',
    title: 'Tail resistor',
    description: 'Resistor from the tail node to the negative rail, in ohms (Ω); from 1 mΩ to 1 GΩ.',
    'x-unit': 'Ω',
    'x-typical': { min: 100, max: 1e7 },
    minimum: MIN_RESISTANCE_OHM,
    maximum: MAX_RESISTANCE_OHM,
  },
  referenceResistanceOhm: {
    type: 'number',
    title: 'Reference resistor',
    description: "Resistor from the positive rail into the mirror's reference transistor; sets the reference current, in ohms (Ω); from 1 mΩ to 1 GΩ.",
    'x-unit': 'Ω',
    'x-typical': { min: 100, max: 1e7 },
    minimum: MIN_RESISTANCE_OHM,
    maximum: MAX_RESISTANCE_OHM,
  },
  emitterResistanceOhm: {
    type: 'number',
    title: 'Emitter resistor',
    description:
      "Emitter resistor of the tail's transistors (under both mirror transistors for the degenerated mirror, under the output transistor only for the Widlar source, under the N× transistor Q4 of the PTAT source, where it sets the current VT·ln(N)/R), in ohms (Ω); from 1 mΩ to 1 GΩ.",
    'x-unit': 'Ω',
    'x-typical': { min: 1, max: 1e6 },
    minimum: MIN_RESISTANCE_OHM,
    maximum: MAX_RESISTANCE_OHM,
  },
  startupResistanceOhm: {
    type: 'number',
    title: 'Start-up resistor',
    description:
      "Resistor from the positive rail to the reference transistor's collector of a self-biased tail (the PTAT source): its small current keeps the loop out of its zero-current state, in ohms (Ω); from 1 mΩ to 1 GΩ.",
    'x-unit': 'Ω',
    'x-typical': { min: 1e4, max: 1e8 },
    minimum: MIN_RESISTANCE_OHM,
    maximum: MAX_RESISTANCE_OHM,
  },
};

/** The largest emitter-area ratio a tail may ask (a ratio of matched unit transistors; beyond it the layout is unusual). */
const MAX_AREA_RATIO = 100;

/** Each tail area-ratio field as the design schema states it. */
const TAIL_RATIO_SCHEMAS: Record<TailRatioField, SchemaNode> = {
  areaRatio: {
    type: 'number',
    title: 'Area ratio N',
    description: "Emitter area of the PTAT cell's degenerated transistor (Q4) over the diode-connected one's (Q3), a dimensionless ratio (IS·N); more than 1, up to 100. The cell's current is VT·ln(N)/R.",
    'x-unit': '1',
    'x-typical': { min: 2, max: 24 },
    exclusiveMinimum: 1,
    maximum: MAX_AREA_RATIO,
  },
  outputAreaRatio: {
    type: 'number',
    title: 'Output area ratio',
    description: "Emitter area of the tail's output transistor (Q9) over the diode-connected one's (Q3), a dimensionless ratio; the tail current is about this times the cell's. From 0.01 to 100; left out: 1.",
    'x-unit': '1',
    'x-typical': { min: 0.5, max: 4 },
    minimum: 0.01,
    maximum: MAX_AREA_RATIO,
    default: 1,
  },
};

/** One topology's branch of the design schema's `tail.oneOf`. */
export function tailBranchSchema(id: TopologyId): SchemaNode {
  const fields = tailFieldsOf(id);
  const ratios = TOPOLOGY_CATALOGUE[id].ratios;
  return {
    type: 'object',
    title: TOPOLOGY_CATALOGUE[id].name,
    additionalProperties: false,
    required: ['topology', ...fields, ...ratios.filter((r) => r.default === undefined).map((r) => r.field)],
    properties: {
      topology: { type: TOPOLOGY_PROPERTY.type, const: id, title: TOPOLOGY_PROPERTY.title, description: TOPOLOGY_PROPERTY.description },
      ...Object.fromEntries(fields.map((field) => [field, TAIL_FIELD_SCHEMAS[field]])),
      ...Object.fromEntries(ratios.map((r) => [r.field, TAIL_RATIO_SCHEMAS[r.field]])),
    },
  };
}

/** The design schema's tail branches, in simplicity order. */
export function tailBranchesSchema(): SchemaNode[] {
  return TOPOLOGIES.map(tailBranchSchema);
}

/**
 * The spec schema's `topologies` items and default: every id, in simplicity order; the default
 * leaves out the tails that need a second device (`needsDevice`: the PTAT source's PNP), which a
 * spec compares only by choice, with that device given.
 */
export function specTopologyChoices(): { items: SchemaNode; default: string[] } {
  return { items: { type: 'string', enum: [...TOPOLOGIES] }, default: TOPOLOGIES.filter((id) => TOPOLOGY_CATALOGUE[id].needsDevice === undefined) };
}

function propertiesOf(schema: SchemaNode): Record<string, SchemaNode> {
  return schema.properties as Record<string, SchemaNode>;
}

/** A copy of the design schema with its tail branches from the catalogue (everything else kept). */
export function designSchemaWithTopologies(designSchema: SchemaNode): SchemaNode {
  const properties = propertiesOf(designSchema);
  return { ...designSchema, properties: { ...properties, tail: { ...properties.tail, oneOf: tailBranchesSchema() } } };
}

/** A copy of the spec schema with its tail options from the catalogue (everything else kept). */
export function specSchemaWithTopologies(specSchema: SchemaNode): SchemaNode {
  const properties = propertiesOf(specSchema);
  return { ...specSchema, properties: { ...properties, topologies: { ...properties.topologies, ...specTopologyChoices() } } };
}
