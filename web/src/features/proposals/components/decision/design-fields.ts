/**
 * The design values a designer may override, read from the design schema (the single source of
 * truth): their titles, units, limits and defaults, and which tail fields each topology has: its
 * resistors (ohms, on the spec's series) and its emitter-area ratios (plain ratios, "8×").
 */
import designSchema from '#shared/schema/design.schema.json';
import type { Design } from '#shared/engine/types';
import { tailRatioFieldsOf, type TailField, type TailRatioField, type TopologyId } from '#shared/engine/topologies';
import { formatQuantity, formatRatio } from '#shared/units/index';
import { typicalRangeOf, type TypicalRange } from '#shared/units/plausibility';

/** A field's key is its JSON path in the design without the leading slash ("tail/emitterResistanceOhm"). */
export type FieldKey = 'collectorResistanceOhm' | 'pairEmitterResistanceOhm' | `tail/${TailField}` | `tail/${TailRatioField}`;

export interface FieldInfo {
  key: FieldKey;
  /** A resistor (ohms, a preferred value of the spec's series) or a ratio of emitter areas (a plain number, shown "8×"). */
  kind: 'resistor' | 'ratio';
  title: string;
  description: string;
  unit: string;
  /** Smallest allowed value and whether it is itself allowed (0 Ω for the pair's RE, above 0 Ω elsewhere, above 1 for the area ratio N). */
  min: number;
  minAllowed: boolean;
  max: number;
  /** The value a design that leaves the field out stands for (the output area ratio's 1). */
  default?: number;
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
  default?: number;
  const?: string;
}

interface BranchSchema {
  title: string;
  required: string[];
  properties: Record<string, PropertySchema>;
}

const branches = designSchema.properties.tail.oneOf as unknown as BranchSchema[];
const topLevel = designSchema.properties as unknown as Record<string, PropertySchema>;

function fieldInfo(key: FieldKey, property: PropertySchema, kind: FieldInfo['kind'] = 'resistor'): FieldInfo {
  return {
    key,
    kind,
    title: property.title ?? key,
    description: property.description ?? '',
    unit: property['x-unit'] ?? 'Ω',
    min: property.exclusiveMinimum ?? property.minimum ?? 0,
    minAllowed: property.exclusiveMinimum === undefined,
    max: property.maximum ?? Infinity,
    default: property.default,
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

/** The tail element's fields of a topology in the schema's order: its resistors, then its area ratios (a defaulted one included). */
export function tailFields(topology: TopologyId): FieldInfo[] {
  const branch = branchOf(topology);
  const ratios: readonly string[] = tailRatioFieldsOf(topology);
  return Object.keys(branch.properties)
    .filter((name) => name !== 'topology')
    .map((name) => fieldInfo(`tail/${name}` as FieldKey, branch.properties[name], ratios.includes(name) ? 'ratio' : 'resistor'));
}

/** Every field shown for a topology: the pair's, then the tail's. */
export function fieldsFor(topology: TopologyId): FieldInfo[] {
  return [...PAIR_FIELDS, ...tailFields(topology)];
}

/** A field's value in a design, in ohms or as a ratio (the schema's default where the design leaves it out: 0 for the pair's RE, 1 for the output area ratio). */
export function fieldValue(design: Design, key: FieldKey): number | undefined {
  if (key === 'collectorResistanceOhm') return design.collectorResistanceOhm;
  if (key === 'pairEmitterResistanceOhm') return design.pairEmitterResistanceOhm ?? 0;
  const name = key.slice('tail/'.length);
  const given = (design.tail as unknown as Record<string, number | undefined>)[name];
  if (given !== undefined) return given;
  return branchOf(design.tail.topology).properties[name]?.default;
}

/** A field's value as people read it: "13.7 kΩ" for a resistor, "8×" for an area ratio. */
export function fieldText(info: Pick<FieldInfo, 'kind' | 'unit'>, value: number, digits = 3): string {
  return info.kind === 'ratio' ? formatRatio(value, digits) : formatQuantity(value, info.unit, digits);
}

/** Every tail field key of every topology, for reading server paths. */
export const TAIL_FIELD_KEYS: readonly FieldKey[] = [
  ...new Set(branches.flatMap((branch) => Object.keys(branch.properties).filter((name) => name !== 'topology').map((name) => `tail/${name}` as FieldKey))),
];
