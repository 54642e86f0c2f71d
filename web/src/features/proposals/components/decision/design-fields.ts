/**
 * The resistor fields a designer may override, read from the design schema (the single source of
 * truth): their titles, units and limits, and which tail fields each topology has.
 */
import designSchema from '#shared/schema/design.schema.json';
import type { Design } from '#shared/engine/types';
import type { TopologyId } from '#shared/engine/topologies';
import { typicalRangeOf, type TypicalRange } from '#shared/units/plausibility';

/** A field's key is its JSON path in the design without the leading slash ("tail/emitterResistanceOhm"). */
export type FieldKey = 'collectorResistanceOhm' | 'pairEmitterResistanceOhm' | 'tail/resistanceOhm' | 'tail/referenceResistanceOhm' | 'tail/emitterResistanceOhm';

export interface FieldInfo {
  key: FieldKey;
  title: string;
  description: string;
  unit: string;
  /** Smallest allowed value and whether it is itself allowed (0 Ω for the pair's RE, above 0 Ω elsewhere). */
  min: number;
  minAllowed: boolean;
  maxOhm: number;
  /** The range the field's values usually fall in (`x-typical`); outside it the form shows a note. */
  typical?: TypicalRange;
}

interface PropertySchema {
  title?: string;
  description?: string;
  'x-unit'?: string;
  minimum?: number;
  exclusiveMinimum?: number;
  maximum?: number;
  const?: string;
}

interface BranchSchema {
  title: string;
  required: string[];
  properties: Record<string, PropertySchema>;
}

const branches = designSchema.properties.tail.oneOf as unknown as BranchSchema[];
const topLevel = designSchema.properties as unknown as Record<string, PropertySchema>;

function fieldInfo(key: FieldKey, property: PropertySchema): FieldInfo {
  return {
    key,
    title: property.title ?? key,
    description: property.description ?? '',
    unit: property['x-unit'] ?? 'Ω',
    min: property.exclusiveMinimum ?? property.minimum ?? 0,
    minAllowed: property.exclusiveMinimum === undefined,
    maxOhm: property.maximum ?? Infinity,
    typical: typicalRangeOf(property),
  };
}

function branchOf(topology: TopologyId): BranchSchema {
  const branch = branches.find((b) => b.properties.topology?.const === topology);
  if (!branch) throw new Error(`The design schema has no tail branch for ${topology}`);
  return branch;
}


/** The pair's fields, the same for every topology. */
export const PAIR_FIELDS: FieldInfo[] = [
  fieldInfo('collectorResistanceOhm', topLevel.collectorResistanceOhm),
  fieldInfo('pairEmitterResistanceOhm', topLevel.pairEmitterResistanceOhm),
];

/** The tail element's resistor fields of a topology, in the schema's order. */
export function tailFields(topology: TopologyId): FieldInfo[] {
  const branch = branchOf(topology);
  return branch.required.filter((name) => name !== 'topology').map((name) => fieldInfo(`tail/${name}` as FieldKey, branch.properties[name]));
}

/** Every field shown for a topology: the pair's, then the tail's. */
export function fieldsFor(topology: TopologyId): FieldInfo[] {
  return [...PAIR_FIELDS, ...tailFields(topology)];
}

/** A field's value in a design, in ohms (0 for an absent pair RE, the schema's default). */
export function fieldValue(design: Design, key: FieldKey): number | undefined {
  if (key === 'collectorResistanceOhm') return design.collectorResistanceOhm;
  if (key === 'pairEmitterResistanceOhm') return design.pairEmitterResistanceOhm ?? 0;
  const name = key.slice('tail/'.length);
  return (design.tail as unknown as Record<string, number | undefined>)[name];
}
