/**
 * The `device.model` part of the two schemas, built from the Gummel-Poon parameter list
 * (shared/engine/bjt-parameters.ts): an object of the named SPICE parameters, each a number in
 * SI units within physical bounds, any other name refused. With `model` present the design's
 * `beta` is no longer required, and a spec's `beta`, `earlyVoltageV` and `saturationCurrentA`
 * left out take the card's BF, VAF and IS (shared/validate.ts): the card is the device. That IS, BF and VAF, where also given, equal the card's is a cross-field rule
 * (shared/validation/cross-field-rules.ts). `npm run generate:topologies` writes this part into
 * design.schema.json and spec.schema.json; device-model-schema.test.ts fails when the files drift.
 * Pure.
 */
import { BJT_PARAMETERS, BJT_PARAMETER_NAMES, type BjtParameterName } from '../engine/bjt-parameters';

type SchemaNode = Record<string, unknown>;

/** Physical bounds of each parameter (inclusive unless `exclusiveMinimum`), and the values seen on small-signal cards. */
interface ParameterBounds {
  minimum?: number;
  exclusiveMinimum?: number;
  maximum: number;
  typical?: { min: number; max: number };
  /** 0 means infinite (SPICE's reading); a positive value must be at least this. */
  zeroOrAtLeast?: number;
}

/** Bounds wide enough for any silicon or compound bipolar card, narrow enough to refuse a slip of units. */
const BOUNDS: Record<BjtParameterName, ParameterBounds> = {
  IS: { minimum: 1e-20, maximum: 1e-9, typical: { min: 1e-18, max: 1e-12 } },
  BF: { minimum: 1, maximum: 10000, typical: { min: 30, max: 800 } },
  NF: { minimum: 0.5, maximum: 5, typical: { min: 0.98, max: 1.1 } },
  VAF: { minimum: 0, maximum: 10000, zeroOrAtLeast: 1, typical: { min: 10, max: 500 } },
  IKF: { minimum: 0, maximum: 1000, typical: { min: 1e-3, max: 10 } },
  ISE: { minimum: 0, maximum: 1e-6, typical: { min: 1e-18, max: 1e-11 } },
  NE: { minimum: 0.5, maximum: 10, typical: { min: 1.2, max: 2.5 } },
  BR: { exclusiveMinimum: 0, maximum: 10000, typical: { min: 0.1, max: 20 } },
  NR: { minimum: 0.5, maximum: 5, typical: { min: 0.98, max: 1.1 } },
  VAR: { minimum: 0, maximum: 10000, zeroOrAtLeast: 0.1, typical: { min: 2, max: 100 } },
  IKR: { minimum: 0, maximum: 1000, typical: { min: 1e-3, max: 10 } },
  ISC: { minimum: 0, maximum: 1e-6, typical: { min: 1e-18, max: 1e-11 } },
  NC: { minimum: 0.5, maximum: 10, typical: { min: 1.2, max: 2.5 } },
  RB: { minimum: 0, maximum: 1e6, typical: { min: 1, max: 1000 } },
  RE: { minimum: 0, maximum: 1e6, typical: { min: 0.1, max: 100 } },
  RC: { minimum: 0, maximum: 1e6, typical: { min: 0.1, max: 1000 } },
  CJE: { minimum: 0, maximum: 1e-8, typical: { min: 1e-13, max: 1e-10 } },
  VJE: { minimum: 0.1, maximum: 2, typical: { min: 0.4, max: 1.1 } },
  MJE: { minimum: 0, maximum: 0.9, typical: { min: 0.2, max: 0.6 } },
  CJC: { minimum: 0, maximum: 1e-8, typical: { min: 1e-13, max: 1e-10 } },
  VJC: { minimum: 0.1, maximum: 2, typical: { min: 0.3, max: 1.1 } },
  MJC: { minimum: 0, maximum: 0.9, typical: { min: 0.2, max: 0.6 } },
  CJS: { minimum: 0, maximum: 1e-8, typical: { min: 0, max: 1e-11 } },
  VJS: { minimum: 0.1, maximum: 2, typical: { min: 0.4, max: 1.1 } },
  MJS: { minimum: 0, maximum: 0.9, typical: { min: 0, max: 0.6 } },
  FC: { minimum: 0, maximum: 0.95, typical: { min: 0.5, max: 0.9 } },
  TF: { minimum: 0, maximum: 1e-3, typical: { min: 1e-12, max: 1e-8 } },
  TR: { minimum: 0, maximum: 1e-3, typical: { min: 1e-10, max: 1e-6 } },
  EG: { minimum: 0.1, maximum: 4, typical: { min: 0.6, max: 1.5 } },
  XTI: { minimum: -10, maximum: 10, typical: { min: 0, max: 5 } },
  XTB: { minimum: -5, maximum: 5, typical: { min: 0, max: 3 } },
  KF: { minimum: 0, maximum: 1e-3, typical: { min: 0, max: 1e-12 } },
  AF: { minimum: 0.1, maximum: 4, typical: { min: 0.8, max: 2 } },
};

/** The unit in words and symbol, as the other fields write it. */
const UNIT_WORDS: Record<string, string> = {
  A: 'in amperes (A)',
  'A/A': 'a ratio (A/A)',
  V: 'in volts (V)',
  'Ω': 'in ohms (Ω)',
  F: 'in farads (F)',
  s: 'in seconds (s)',
  eV: 'in electronvolts (eV)',
  '': 'dimensionless',
};

/** The schema's unit symbol of a parameter ("1" for a pure number, as SI writes it). */
function unitSymbol(name: BjtParameterName): string {
  return BJT_PARAMETERS[name].unit || '1';
}

function unitText(name: BjtParameterName): string {
  return UNIT_WORDS[BJT_PARAMETERS[name].unit];
}

function limitText(bounds: ParameterBounds): string {
  if (bounds.zeroOrAtLeast !== undefined) return `0 (infinite) or ${bounds.zeroOrAtLeast} to ${bounds.maximum}`;
  const low = bounds.exclusiveMinimum !== undefined ? `more than ${bounds.exclusiveMinimum}` : `${bounds.minimum} or more`;
  return `${low}, up to ${bounds.maximum}`;
}

function defaultText(name: BjtParameterName): string {
  const info = BJT_PARAMETERS[name];
  return info.default === Infinity ? 'infinite' : String(info.default);
}

/** One parameter's schema: number, bounds, unit, the default SPICE gives when it is left out. */
export function parameterSchema(name: BjtParameterName): SchemaNode {
  const info = BJT_PARAMETERS[name];
  const bounds = BOUNDS[name];
  const zero = info.zeroMeansInfinite && BOUNDS[name].zeroOrAtLeast === undefined ? ' 0 means infinite.' : '';
  const node: SchemaNode = {
    type: 'number',
    title: name,
    description: `${info.meaning[0].toUpperCase()}${info.meaning.slice(1)}, ${unitText(name)}; ${limitText(bounds)}.${zero} Left out: ${defaultText(name)} (SPICE's default).`,
  };
  node['x-unit'] = unitSymbol(name);
  if (bounds.typical) node['x-typical'] = bounds.typical;
  if (bounds.minimum !== undefined) node.minimum = bounds.minimum;
  if (bounds.exclusiveMinimum !== undefined) node.exclusiveMinimum = bounds.exclusiveMinimum;
  node.maximum = bounds.maximum;
  if (bounds.zeroOrAtLeast !== undefined) node.not = { exclusiveMinimum: 0, exclusiveMaximum: bounds.zeroOrAtLeast };
  return node;
}

/** The `device.model` object: every parameter by its SPICE name, nothing else. */
export function deviceModelSchema(): SchemaNode {
  return {
    type: 'object',
    title: 'SPICE model card',
    description:
      "The transistor's Gummel-Poon parameters by their SPICE names, SI units; a parameter left out takes SPICE's default. When given, this card is the device: current gain, Early voltage and saturation current may be left out, and where given must equal BF, VAF and IS.",
    additionalProperties: false,
    properties: Object.fromEntries(BJT_PARAMETER_NAMES.map((name) => [name, parameterSchema(name)])),
  };
}

/** The device fields that take the card's value when `model` is given. */
const CARD_FIELDS = ['beta', 'earlyVoltageV', 'saturationCurrentA'] as const;

function propertiesOf(schema: SchemaNode): Record<string, SchemaNode> {
  return schema.properties as Record<string, SchemaNode>;
}

/** A device schema with `model` among its properties (placed after the three fields it stands for). */
function withModelProperty(device: SchemaNode): Record<string, SchemaNode> {
  const entries = Object.entries(propertiesOf(device)).filter(([field]) => field !== 'model');
  const at = Math.max(...CARD_FIELDS.map((field) => entries.findIndex(([name]) => name === field))) + 1;
  entries.splice(at, 0, ['model', deviceModelSchema()]);
  return Object.fromEntries(entries);
}

const WITHOUT_MODEL = { not: { required: ['model'] } };

/**
 * `device.pnp`: the PNP transistor some tails need (the `ptat` tail's mirror), as the NPN device
 * is given: IS, BF, VAF, or a `model` card of the same parameters. Optional; a design or spec
 * whose tail has a PNP must give it (shared/validation/cross-field-rules.ts).
 */
export function pnpDeviceSchema(): SchemaNode {
  return {
    type: 'object',
    title: 'PNP transistor',
    description:
      "The PNP transistor of tails that need one (the PTAT tail's mirror), SPICE's Gummel-Poon model as for the NPN: current gain, Early voltage and saturation current, or a model card. Needed only when such a tail is chosen.",
    additionalProperties: false,
    properties: {
      beta: {
        type: 'number',
        title: 'PNP current gain (beta)',
        description: 'Forward current gain BF of the PNP, a ratio (A/A). Typical small-signal PNP: 50 to 300.',
        'x-unit': 'A/A',
        minimum: 10,
        maximum: 2000,
      },
      earlyVoltageV: {
        type: 'number',
        title: 'PNP Early voltage',
        description: 'Forward Early voltage VAF of the PNP, in volts (V), as SPICE writes it (positive). 0 means infinite (no Early effect); otherwise 1 to 1000 V.',
        'x-unit': 'V',
        minimum: 0,
        maximum: 1000,
        not: { exclusiveMinimum: 0, exclusiveMaximum: 1 },
      },
      saturationCurrentA: {
        type: 'number',
        title: 'PNP saturation current IS',
        description: 'Transport saturation current IS of the PNP at 27 °C, in amperes (A); from 1e-20 A to 1 nA. Leave empty to derive it from a VBE of 0.65 V at 1 mA.',
        'x-unit': 'A',
        minimum: 1e-20,
        maximum: 1e-9,
      },
      model: { ...deviceModelSchema(), title: 'PNP SPICE model card' },
    },
  };
}

/** A device schema's properties with `pnp` (after `model`). */
function withPnpProperty(properties: Record<string, SchemaNode>): Record<string, SchemaNode> {
  const { pnp: _pnp, ...rest } = properties;
  return { ...rest, pnp: pnpDeviceSchema() };
}

/** A copy of the design schema with `device.model`; `beta` required only without a card. */
export function designSchemaWithDeviceModel(designSchema: SchemaNode): SchemaNode {
  const properties = propertiesOf(designSchema);
  const { required: _required, if: _if, then: _then, ...device } = properties.device;
  const rest = Object.fromEntries(Object.entries(device).filter(([key]) => key !== 'properties'));
  return {
    ...designSchema,
    properties: {
      ...properties,
      device: { ...rest, properties: withPnpProperty(withModelProperty(device)), if: WITHOUT_MODEL, then: { required: ['beta'] } },
    },
  };
}

/**
 * A copy of the spec schema with `device.model`. No `if`/`then` here: the spec form's precompiled
 * validator cannot evaluate conditions, so `beta` and `earlyVoltageV` keep their defaults and
 * validation puts the card's BF, VAF and IS in the fields the spec left out
 * (shared/validate.ts, `withCardValues`).
 */
export function specSchemaWithDeviceModel(specSchema: SchemaNode): SchemaNode {
  const properties = propertiesOf(specSchema);
  const { if: _if, then: _then, ...device } = properties.device;
  const deviceProperties = withModelProperty(device);
  const thenDefaults = ((_then as SchemaNode | undefined)?.properties ?? {}) as Record<string, SchemaNode>;
  for (const field of CARD_FIELDS) {
    const fallback = thenDefaults[field]?.default;
    if (fallback !== undefined) deviceProperties[field] = { ...deviceProperties[field], default: fallback };
  }
  const rest = Object.fromEntries(Object.entries(device).filter(([key]) => key !== 'properties'));
  return { ...specSchema, properties: { ...properties, device: { ...rest, properties: withPnpProperty(deviceProperties) } } };
}
