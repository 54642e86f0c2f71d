import { describe, expect, test } from 'vitest';
import { TOPOLOGIES } from '#shared/engine/types';
import { UNIT_SYMBOLS } from '#shared/units/unit-symbols';
import { DESIGN_SCHEMA, SPEC_SCHEMA } from '#shared/validate';
import { BJT_PARAMETER_NAMES } from '#shared/engine/bjt-parameters';
import { FULL_DESIGN, FULL_SPEC, TAILS } from './schema-fixtures';

/** Every model-card parameter given (the values do not matter to the field lists). */
const FULL_CARD = Object.fromEntries(BJT_PARAMETER_NAMES.map((name) => [name, 1]));

type Node = Record<string, unknown> & {
  type?: string;
  properties?: Record<string, Node>;
  oneOf?: Node[];
  default?: unknown;
  'x-unit'?: string;
};

/** Every property schema with its JSON pointer; a oneOf's branches share their parent's path. */
function properties(schema: Node, pointer = ''): [string, Node][] {
  const own = Object.entries(schema.properties ?? {}).flatMap(([name, child]): [string, Node][] => [
    [`${pointer}/${name}`, child],
    ...properties(child, `${pointer}/${name}`),
  ]);
  const branches = (schema.oneOf ?? []).flatMap((branch) => properties(branch, pointer));
  return [...own, ...branches];
}

/** Every object schema's JSON pointer with its declared property names (branches merged). */
function objectKeys(schema: Node, pointer = ''): Record<string, string[]> {
  const result: Record<string, string[]> = {};
  const visit = (node: Node, at: string) => {
    if (node.type !== 'object') return;
    const names = [...Object.keys(node.properties ?? {}), ...(node.oneOf ?? []).flatMap((b) => Object.keys(b.properties ?? {}))];
    result[at] = [...new Set([...(result[at] ?? []), ...names])].sort();
    Object.entries(node.properties ?? {}).forEach(([name, child]) => visit(child, `${at}/${name}`));
    (node.oneOf ?? []).forEach((branch) => Object.entries(branch.properties ?? {}).forEach(([name, child]) => visit(child, `${at}/${name}`)));
  };
  visit(schema, pointer);
  return result;
}

/** The same map for a value: every plain object's pointer and its keys (values of several shapes merged). */
function valueKeys(values: unknown[]): Record<string, string[]> {
  const result: Record<string, string[]> = {};
  const visit = (value: unknown, at: string) => {
    if (!value || typeof value !== 'object' || Array.isArray(value)) return;
    result[at] = [...new Set([...(result[at] ?? []), ...Object.keys(value)])].sort();
    Object.entries(value).forEach(([name, child]) => visit(child, `${at}/${name}`));
  };
  values.forEach((v) => visit(v, ''));
  return result;
}

const SCHEMAS: [string, Node][] = [
  ['spec', SPEC_SCHEMA as Node],
  ['design', DESIGN_SCHEMA as Node],
];
const KNOWN_UNITS = UNIT_SYMBOLS.map((u) => u.symbol);

describe.each(SCHEMAS)('%s schema', (_name, schema) => {
  test('is draft-07, for ajv\u2019s default class and rjsf', () => {
    expect(schema.$schema).toBe('http://json-schema.org/draft-07/schema#');
  });

  test.each(properties(schema))('%s has a title and a description', (_pointer, node) => {
    expect(typeof node.title).toBe('string');
    expect(String(node.description).length).toBeGreaterThan(20);
  });

  test.each(properties(schema).filter(([, n]) => n.type === 'number' || n.type === 'integer'))(
    '%s names its unit in x-unit and in words',
    (_pointer, node) => {
      expect(KNOWN_UNITS).toContain(node['x-unit']);
      const unit = node['x-unit'] as string;
      expect(node.description).toContain(unit === '1' ? 'dimensionless' : `(${unit})`);
    },
  );

  test.each(properties(schema).filter(([, n]) => n.type === 'object' || n.oneOf))(
    '%s allows no unknown property',
    (_pointer, node) => {
      const objects = node.oneOf ?? [node];
      objects.forEach((o) => expect(o.additionalProperties).toBe(false));
    },
  );

  test('the top level allows no unknown property', () => {
    expect(schema.additionalProperties).toBe(false);
  });
});

describe('spec schema against the Spec type', () => {
  test('declares exactly the fields of Spec, level by level', () => {
    expect(objectKeys(SPEC_SCHEMA as Node)).toEqual(valueKeys([FULL_SPEC, { device: { model: FULL_CARD, pnp: { model: FULL_CARD } } }]));
  });

  test('requires title, supply, gain and cmrr', () => {
    expect(SPEC_SCHEMA.required).toEqual(['title', 'supply', 'gain', 'cmrr']);
  });

  test('every field has a default except what the user must state, the two optional overrides, the library record, the optional targets and the current-gain spread', () => {
    const withoutDefault = properties(SPEC_SCHEMA as Node)
      .filter(([, node]) => node.default === undefined)
      .map(([pointer]) => pointer);
    expect(withoutDefault.sort()).toEqual(
      [
        '/title',
        '/supply',
        '/supply/positiveV',
        '/supply/negativeV',
        '/gain',
        '/gain/target',
        '/cmrr',
        '/cmrr/minDb',
        '/device/saturationCurrentA', // absent means "derive IS from vbeOnV"
        '/device/model', // absent means "the three-parameter device"
        ...BJT_PARAMETER_NAMES.map((name) => `/device/model/${name}`), // absent means SPICE's default
        // the PNP, needed only by a tail that has one (the PTAT source): absent means none given
        '/device/pnp',
        '/device/pnp/beta',
        '/device/pnp/earlyVoltageV',
        '/device/pnp/saturationCurrentA',
        '/device/pnp/model',
        ...BJT_PARAMETER_NAMES.map((name) => `/device/pnp/model/${name}`),
        '/tailCurrentA', // absent means "let the sizing choose"
        '/deviceModel', // absent means "the device values were typed in"
        '/deviceModel/name',
        '/deviceModel/checksum',
        // Targets: absent means "not checked"
        '/noise',
        '/noise/maxVPerRtHz',
        '/noise/atFrequencyHz',
        '/inputBiasCurrentMaxA',
        '/offset',
        '/offset/maxV',
        '/offset/driftMaxVPerC',
        '/slewRateMinVPerS',
        '/bandwidthMinHz',
        '/psrrMinDb',
        '/psrrMinDb/positive',
        '/psrrMinDb/negative',
        '/linearInputRangeMinV',
        // absent means half and twice the nominal current gain (relative, so no fixed default)
        '/betaRange',
        '/betaRange/min',
        '/betaRange/max',
      ].sort(),
    );
  });

  test('lists the topologies of types.ts, by default all but those needing a second device (the PTAT source\'s PNP)', () => {
    const topologies = (SPEC_SCHEMA.properties as Record<string, Node>).topologies;
    expect((topologies.items as Node).enum).toEqual([...TOPOLOGIES]);
    expect(topologies.default).toEqual(TOPOLOGIES.filter((id) => id !== 'ptat'));
  });
});

describe('design schema against the Design type', () => {
  test('declares exactly the fields of Design and of each TailDesign, level by level', () => {
    const designs = TAILS.map((tail) => ({ ...FULL_DESIGN, tail }));
    expect(objectKeys(DESIGN_SCHEMA as Node)).toEqual(valueKeys([...designs, { device: { model: FULL_CARD, pnp: { model: FULL_CARD } } }]));
  });

  test('requires what the contract requires', () => {
    expect(DESIGN_SCHEMA.required).toEqual(['device', 'supply', 'collectorResistanceOhm', 'tail']);
  });

  test('has one tail branch per topology of types.ts, in order', () => {
    const tail = (DESIGN_SCHEMA.properties as Record<string, Node>).tail;
    const consts = (tail.oneOf ?? []).map((b) => (b.properties?.topology as Node).const);
    expect(consts).toEqual([...TOPOLOGIES]);
  });
});
