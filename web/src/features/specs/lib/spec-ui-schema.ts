/**
 * How the spec form looks: the title across the top, then cards of related fields, words for
 * enum values, and the engineering-notation widget on every field with a unit. The schema
 * (served by the API) stays the single source of fields, titles, defaults and limits.
 */
import type { UiSchema } from '@rjsf/utils';
import type { FormLayout } from '../../../components/forms/object-field-template';
import type { SchemaNode } from './schema-nodes';
import { TOPOLOGIES, TOPOLOGY_CATALOGUE, topologyName } from '#shared/engine/topologies';
import { pnpStageRefusal } from '#shared/validation/cross-field-rules';
import { PNP_TAILS } from './pnp-choice';

export const SPEC_LAYOUT: FormLayout = {
  lead: ['title'],
  cards: [
    { title: 'Supply', fields: ['supply', 'supplyTolerance'], note: 'Every requirement must hold with each rail anywhere in its tolerance.' },
    { title: 'Gain', fields: ['gain'] },
    { title: 'Rejection', fields: ['cmrr', 'tailCapacitanceF', 'psrrMinDb'] },
    { title: 'Source and load', fields: ['sourceResistanceOhm', 'loadCapacitanceF'], note: 'What drives the inputs and what the collectors drive: they set the bandwidth.' },
    { title: 'Input', fields: ['noise', 'inputBiasCurrentMaxA', 'offset', 'linearInputRangeMinV'], note: 'Optional targets: one left empty is not checked.' },
    { title: 'Speed', fields: ['slewRateMinVPerS', 'bandwidthMinHz'], note: 'Optional targets: one left empty is not checked.' },
    { title: 'Input common mode', fields: ['inputCommonMode'], note: 'DC range on both bases, strictly between the rails.' },
    { title: 'Output & power', fields: ['outputSwingVpp', 'outputSwingMaxCompressionPercent', 'powerBudgetW', 'tailCurrentA'] },
    { title: 'Temperature', fields: ['temperatureC'] },
    { title: 'Options', fields: ['topologies', 'policy'] },
    { title: 'Device', fields: ['deviceModel', 'device', 'betaRange'], note: 'One model for every transistor of the stage, NPN or PNP as its family; an NPN stage takes a PNP too when a chosen tail needs one.' },
    { title: 'Resistors', fields: ['resistors'] },
    { title: 'Monte Carlo', fields: ['monteCarlo'], note: 'Yield of the differential CMRR under tolerance and mismatch.' },
    { title: 'Hazards', fields: ['hazards'], note: 'Conditions that add safety cautions to the report.' },
  ],
};

/** The tail options' names: the catalogue's, as on every other page. */
export const TOPOLOGY_WORDS: Record<string, string> = Object.fromEntries(TOPOLOGIES.map((id) => [id, topologyName(id)]));

/** The tail options as the picker offers them: a tail that needs a second device says so beside its name. */
const TOPOLOGY_PICKER_WORDS: Record<string, string> = Object.fromEntries(
  TOPOLOGIES.map((id) => [id, TOPOLOGY_CATALOGUE[id].needsDevice === 'pnp' ? `${topologyName(id)} — needs a PNP transistor` : topologyName(id)]),
);

/** What the picker says under the options about the tails that need a PNP. */
const TOPOLOGY_PICKER_HELP = `${PNP_TAILS.map((id) => topologyName(id)).join(' and ')}: its current rises with absolute temperature, so the pair’s gm, and a resistor-loaded gain, hold over temperature. It mirrors through PNP transistors, so choosing it asks for the PNP under Device; it is left out unless chosen.`;

/** The tail options as the picker offers them to a PNP stage: the tails that need a PNP mirror would need an NPN one there. */
const PNP_STAGE_PICKER_WORDS: Record<string, string> = { ...TOPOLOGY_PICKER_WORDS, ...Object.fromEntries(PNP_TAILS.map((id) => [id, `${topologyName(id)} — needs an NPN pair`])) };

/** What the picker says under the options for a PNP stage: the server's refusal of those tails, in its words. */
const PNP_STAGE_PICKER_HELP = `With a PNP pair, not offered: ${pnpStageRefusal(PNP_TAILS)}.`;

/**
 * The form's settings for the device family chosen: a PNP stage (`device.family` "pnp") offers
 * the tails that need a PNP mirror disabled, with the reason under the options (one already chosen
 * stays enabled, so it can be left out; the form says it is refused until then).
 */
export function uiSchemaForFamily(ui: UiSchema, family: unknown, chosenTopologies: readonly string[]): UiSchema {
  if (family !== 'pnp') return ui;
  const { 'ui:help': _npnHelp, ...topologies } = ui.topologies as UiSchema;
  const refusedChosen = PNP_TAILS.some((id) => chosenTopologies.includes(id));
  return {
    ...ui,
    topologies: {
      ...topologies,
      'ui:enumNames': PNP_STAGE_PICKER_WORDS,
      'ui:enumDisabled': PNP_TAILS.filter((id) => !chosenTopologies.includes(id)),
      // While such a tail is still chosen, the refusal beside the options says it
      ...(refusedChosen ? {} : { 'ui:help': PNP_STAGE_PICKER_HELP }),
    },
  };
}

/** The device families in the form's words. */
const FAMILY_WORDS: Record<string, string> = { npn: 'NPN bipolar', pnp: 'PNP bipolar' };

/** Words for enum values, by property name; also used to print values in the version history. */
export const ENUM_WORDS: Record<string, Record<string, string>> = {
  topologies: TOPOLOGY_WORDS,
  policy: { 'simplest-sufficient': 'Simplest sufficient', 'highest-rejection': 'Highest rejection' },
  output: { differential: 'Differential', 'single-ended': 'Single-ended' },
  family: { npn: 'NPN', pnp: 'PNP' },
};

export const SPEC_UI_SCHEMA: UiSchema = {
  'ui:options': { layout: SPEC_LAYOUT },
  title: { 'ui:placeholder': 'e.g. Bridge amplifier input stage', 'ui:options': { large: true, wide: true } },
  deviceModel: { 'ui:field': 'deviceModel' },
  device: {
    // NPN or PNP pair: the PNP stage is the NPN one's mirror image (tail from the positive rail, loads to the negative)
    family: { 'ui:widget': 'radio', 'ui:enumNames': FAMILY_WORDS, 'ui:options': { wide: true } },
    saturationCurrentA: { 'ui:placeholder': 'from VBE at 1 mA' },
    model: { 'ui:field': 'cardModel' },
    pnp: {
      'ui:field': 'pnpDevice',
      saturationCurrentA: { 'ui:placeholder': 'from VBE at 1 mA' },
      model: { 'ui:field': 'cardModel' },
    },
  },
  gain: { output: { 'ui:widget': 'radio', 'ui:enumNames': ENUM_WORDS.output, 'ui:options': { wide: true } } },
  resistors: { series: { 'ui:widget': 'radio' } },
  inputCommonMode: { minV: { 'ui:title': 'Lowest' }, maxV: { 'ui:title': 'Highest' } },
  temperatureC: { min: { 'ui:title': 'Lowest' }, max: { 'ui:title': 'Highest' } },
  tailCurrentA: { 'ui:placeholder': 'Longtail chooses' },
  psrrMinDb: { positive: { 'ui:placeholder': 'not checked' }, negative: { 'ui:placeholder': 'not checked' } },
  noise: { maxVPerRtHz: { 'ui:placeholder': 'not checked' }, atFrequencyHz: { 'ui:placeholder': 'e.g. 1k' } },
  inputBiasCurrentMaxA: { 'ui:placeholder': 'not checked' },
  offset: { maxV: { 'ui:placeholder': 'not checked' }, driftMaxVPerC: { 'ui:placeholder': 'not checked' } },
  linearInputRangeMinV: { 'ui:placeholder': 'not checked' },
  slewRateMinVPerS: { 'ui:placeholder': 'not checked' },
  bandwidthMinHz: { 'ui:placeholder': 'not checked' },
  betaRange: { min: { 'ui:placeholder': 'half the nominal' }, max: { 'ui:placeholder': 'twice the nominal' } },
  topologies: { 'ui:widget': 'checkboxes', 'ui:enumNames': TOPOLOGY_PICKER_WORDS, 'ui:help': TOPOLOGY_PICKER_HELP, 'ui:options': { wide: true } },
  policy: { 'ui:widget': 'radio', 'ui:enumNames': ENUM_WORDS.policy, 'ui:options': { wide: true } },
};

/** Whether a schema node is a number with a unit worth reading as a quantity ("1" is a plain count). */
function isQuantity(node: SchemaNode): boolean {
  return (node.type === 'number' || node.type === 'integer') && typeof node['x-unit'] === 'string' && node['x-unit'] !== '1';
}

/** `ui` with the quantity widget set on every field of `schema` that has a unit (other settings kept). */
export function withQuantityWidgets(schema: SchemaNode, ui: UiSchema = {}): UiSchema {
  const properties = (schema.properties ?? {}) as Record<string, SchemaNode>;
  const result: UiSchema = { ...ui };
  for (const [name, node] of Object.entries(properties)) {
    const own = (ui[name] ?? {}) as UiSchema;
    if (node.type === 'object') result[name] = withQuantityWidgets(node, own);
    else if (isQuantity(node) && own['ui:widget'] === undefined) result[name] = { ...own, 'ui:widget': 'quantity' };
  }
  return result;
}
