/**
 * Rules relating two fields, run after the schema has passed. Each issue sits at the field
 * that breaks the rule (its `path`) and names the other field by its label, with both numbers:
 * "must be below the positive rail (12 V), got 14 V".
 */
import { BJT_PARAMETERS, hasModelCard, resolvedParameters, type BjtModelCard, type BjtParameterName } from '../engine/bjt-parameters';
import { TOPOLOGY_CATALOGUE, type TopologyId } from '../engine/topologies';
import type { Design, DeviceParams, Spec, Supply } from '../engine/types';
import { designFieldLabel, mosDesignFieldLabel, specFieldLabel } from './field-labels';
import type { MosDesign } from '../engine/mos-stage';
import { mosSurfacePotentialV } from '../engine/mos-device';
import { resolvedMosParameters } from '../engine/mos-parameters';
import { NOMINAL_TEMPERATURE_C } from '../engine/constants';
import type { ValidationIssue } from './validation-issue';

/** How the spec's and the design's rails are named (the same titles in both schemas). */
type Label = (pointer: string) => string;

/** Every cross-field problem of a schema-valid spec. */
export function specCrossFieldIssues(spec: Spec): ValidationIssue[] {
  const label = specFieldLabel;
  const issues = [
    ...optionalResistanceIssues('/sourceResistanceOhm', spec.sourceResistanceOhm),
    ...railOrderIssues(spec.supply, label),
    ...deviceCardIssues(spec.device),
    ...familyIssues(spec.device, spec.topologies, '/topologies', 'the tail options include'),
    ...(spec.device.family === 'pnp' ? [] : pnpIssues(spec.device, spec.topologies, 'the tail options include', label)),
    ...betaRangeIssues(spec, label),
    ...offsetLimitIssues(spec, label),
    ...noisePairIssues(spec, label),
  ];
  const { minV, maxV } = spec.inputCommonMode;
  if (minV > maxV) {
    issues.push({ path: '/inputCommonMode/minV', message: `must be at most ${label('/inputCommonMode/maxV')} (${volts(maxV)}), got ${volts(minV)}` });
  }
  const { min: minC, max: maxC } = spec.temperatureC;
  if (minC > maxC) {
    issues.push({ path: '/temperatureC/min', message: `must be at most ${label('/temperatureC/max')} (${maxC} °C), got ${minC} °C` });
  }
  if (issues.some((i) => i.path === '/supply/negativeV')) return issues;
  issues.push(...insideRailsIssues('/inputCommonMode/minV', minV, spec.supply, label));
  issues.push(...insideRailsIssues('/inputCommonMode/maxV', maxV, spec.supply, label));
  const spanV = tidy(spec.supply.positiveV - spec.supply.negativeV);
  if (spec.outputSwingVpp >= spanV) {
    issues.push({
      path: '/outputSwingVpp',
      message: `must be less than the span from ${label('/supply/negativeV')} to ${label('/supply/positiveV')} (${volts(spanV)}), got ${volts(spec.outputSwingVpp)}`,
    });
  }
  return issues;
}

/** Every cross-field problem of a schema-valid design (defaults applied). */
export function designCrossFieldIssues(design: Design): ValidationIssue[] {
  const issues = [
    ...optionalResistanceIssues('/pairEmitterResistanceOhm', design.pairEmitterResistanceOhm),
    ...optionalResistanceIssues('/sourceResistanceOhm', design.sourceResistanceOhm),
    ...railOrderIssues(design.supply, designFieldLabel),
  ];
  const cardIssues = [
    ...deviceCardIssues(design.device),
    ...familyIssues(design.device, [design.tail.topology], '/tail/topology', 'the tail is'),
    ...(design.device.family === 'pnp' ? [] : pnpIssues(design.device, [design.tail.topology], 'the tail is', designFieldLabel)),
  ];
  // Stryker disable next-line ConditionalExpression: equivalent, an undefined voltage compares false with both rails and gives no issue
  if (issues.length > 0 || design.inputCommonModeV === undefined) return [...issues, ...cardIssues];
  return [...cardIssues, ...insideRailsIssues('/inputCommonModeV', design.inputCommonModeV, design.supply, designFieldLabel)];
}

/**
 * The cross-field rules of a MOS design ("nmos" / "pmos"): the rails in order, the input common
 * mode between them, and VTO signed as SPICE writes it for the family (positive for an
 * enhancement NMOS, negative for an enhancement PMOS): a card of the other sign describes a
 * depletion device, which none of the MOS tails can bias.
 */
export function mosDesignCrossFieldIssues(design: MosDesign): ValidationIssue[] {
  const label = mosDesignFieldLabel;
  const issues = railOrderIssues(design.supply, label);
  const vto = design.device.model.VTO;
  if (design.device.family === 'nmos' && !(vto! > 0)) {
    issues.push({ path: '/device/model/VTO', message: `must be above 0 V for an NMOS (SPICE's sign: an enhancement NMOS has a positive threshold), got ${volts(vto!)}` });
  }
  if (design.device.family === 'pmos' && !(vto! < 0)) {
    issues.push({ path: '/device/model/VTO', message: `must be below 0 V for a PMOS (SPICE's sign: an enhancement PMOS has a negative threshold), got ${volts(vto!)}` });
  }
  issues.push(...surfacePotentialIssues(design));
  if (issues.length > 0 || design.inputCommonModeV === undefined) return issues;
  return insideRailsIssues('/inputCommonModeV', design.inputCommonModeV, design.supply, label);
}

/**
 * PHI carried to the design's temperature by ngspice's law (mos-device.ts) must stay positive:
 * a small PHI falls through zero when hot (PHI = 0.3 V does near 120 °C), where the level-1
 * threshold has no meaning and ngspice's figures turn to NaN.
 */
function surfacePotentialIssues(design: MosDesign): ValidationIssue[] {
  const temperatureC = design.temperatureC ?? NOMINAL_TEMPERATURE_C;
  const phiV = resolvedMosParameters(design.device.model).PHI;
  if (!(phiV > 0)) return [];
  const atTemperatureV = mosSurfacePotentialV(phiV, temperatureC);
  if (atTemperatureV > 0) return [];
  return [{ path: '/device/model/PHI', message: `must stay positive at ${temperatureC} °C: ${phiV} V falls to ${atTemperatureV.toPrecision(3)} V there by ngspice's level-1 temperature law; give a larger PHI (about 0.6 V is usual) or lower ${mosDesignFieldLabel('/temperatureC')}` }];
}

/** The MOS families: not a device `recommend` or the web forms know yet. */
const MOS_FAMILIES: readonly unknown[] = ['nmos', 'pmos'];

/**
 * A document whose device is of a MOS family, where only bipolar pairs are taken (`recommend`,
 * the web app's spec and design forms): one issue naming the field and where MOS pairs are
 * analysed, instead of the schema's every field it does not know.
 */
export function mosFamilyRefusal(input: unknown, where: string): ValidationIssue[] {
  const device = (input as { device?: unknown } | null)?.device;
  const family = device !== null && typeof device === 'object' ? (device as { family?: unknown }).family : undefined;
  if (!MOS_FAMILIES.includes(family)) return [];
  return [{ path: '/device/family', message: `"${String(family)}" is not available ${where} yet: MOS pairs are analysed by \`longtail analyze\` alone (sizing and ranking take "npn" or "pnp")` }];
}

/** The device fields a model card stands for, each with the card's parameter. */
const CARD_FIELDS: readonly { field: 'beta' | 'earlyVoltageV' | 'saturationCurrentA'; parameter: BjtParameterName }[] = [
  { field: 'beta', parameter: 'BF' },
  { field: 'earlyVoltageV', parameter: 'VAF' },
  { field: 'saturationCurrentA', parameter: 'IS' },
];

/** Two values agree to the last few digits (a card read from text may round in the last place). */
function sameValue(a: number, b: number): boolean {
  return a === b || (Number.isFinite(a) && Number.isFinite(b) && Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b)));
}

/**
 * The PNP transistor (`device.pnp`) of the tails that need one (the catalogue's `needsDevice`):
 * required when such a tail is chosen, given by its current gain or a model card, and its card
 * holds to the same rule as the NPN's.
 */
function pnpIssues(device: DeviceParams | undefined, topologies: readonly TopologyId[], chosen: string, label: Label): ValidationIssue[] {
  const needing = topologies.filter((id) => TOPOLOGY_CATALOGUE[id].needsDevice === 'pnp');
  const pnp = device?.pnp;
  if (!pnp) {
    if (needing.length === 0) return [];
    const names = needing.map((id) => TOPOLOGY_CATALOGUE[id].name).join(' and ');
    return [{ path: '/device/pnp', message: `is required: ${chosen} the ${names}, whose mirror is PNP; give ${label('/device/pnp/beta')}, ${label('/device/pnp/earlyVoltageV')} and ${label('/device/pnp/saturationCurrentA')}, or its model card` }];
  }
  if (pnp.beta === undefined && !hasModelCard(pnp)) {
    return [{ path: '/device/pnp/beta', message: `is required unless ${label('/device/pnp/model')} is given` }];
  }
  return deviceCardIssues(pnp, '/device/pnp');
}

/**
 * A PNP stage (`device.family` "pnp") takes the mirror image of every tail built from the stage's
 * own device; a tail that needs a second device of the opposite type (the catalogue's
 * `needsDevice`, the PTAT tail's PNP mirror) would need an NPN there, which a design cannot carry.
 */
export function familyIssues(device: DeviceParams | undefined, topologies: readonly TopologyId[], path: string, chosen: string): ValidationIssue[] {
  if (device?.family !== 'pnp') return [];
  const needing = topologies.filter((id) => TOPOLOGY_CATALOGUE[id].needsDevice !== undefined);
  if (needing.length === 0) return [];
  return [{ path, message: `${chosen} ${pnpStageRefusal(needing)}` }];
}

/** Why a PNP stage cannot take these tails (each needs a second device of the opposite type), in the words of the refusal; the spec form says it under its tail options too. */
export function pnpStageRefusal(needing: readonly TopologyId[]): string {
  const names = needing.map((id) => TOPOLOGY_CATALOGUE[id].name).join(' and ');
  const verb = needing.length > 1 ? 'need' : 'needs';
  return `the ${names}, which ${verb} an NPN pair (device family "npn"): its mirror is of the opposite type, an NPN for a PNP pair, which a design cannot carry; choose another tail or the NPN family`;
}

/** With `device.model` given, `beta`, `earlyVoltageV` and `saturationCurrentA` may be left out, and where given equal BF, VAF and IS. */
function deviceCardIssues(device: { model?: BjtModelCard; beta?: number; earlyVoltageV?: number; saturationCurrentA?: number } | undefined, at = '/device'): ValidationIssue[] {
  if (!device?.model || !hasModelCard(device)) return [];
  const card = resolvedParameters(device.model);
  const issues: ValidationIssue[] = [];
  for (const { field, parameter } of CARD_FIELDS) {
    const given = device[field];
    if (given === undefined) continue;
    // An Early voltage of 0 is infinite, as the card's VAF left out or 0
    const read = field === 'earlyVoltageV' && given === 0 ? Infinity : given;
    if (sameValue(read, card[parameter])) continue;
    const unit = BJT_PARAMETERS[parameter].unit;
    const cardText = Number.isFinite(card[parameter]) ? `${card[parameter]} ${unit}` : 'infinite';
    const origin = device.model[parameter] === undefined ? ", SPICE's default as the card leaves it out" : '';
    issues.push({ path: `${at}/${field}`, message: `must equal the model card's ${parameter} (${cardText}${origin}), got ${given} ${unit}` });
  }
  return issues;
}

/**
 * The current-gain spread holds the nominal current gain (`device.beta`, the card's BF with a
 * model card): lowest at most nominal, highest at least nominal. An end left out has its
 * documented default relative to the nominal, so it cannot contradict it.
 */
function betaRangeIssues(spec: Pick<Spec, 'betaRange' | 'device'>, label: Label): ValidationIssue[] {
  const { min, max } = spec.betaRange ?? {};
  const nominal = spec.device.beta;
  const issues: ValidationIssue[] = [];
  if (min !== undefined && max !== undefined && min > max) {
    return [{ path: '/betaRange/min', message: `must be at most ${label('/betaRange/max')} (${max}), got ${min}` }];
  }
  if (min !== undefined && min > nominal) issues.push({ path: '/betaRange/min', message: `must be at most ${label('/device/beta')} (${nominal}), got ${min}` });
  if (max !== undefined && max < nominal) issues.push({ path: '/betaRange/max', message: `must be at least ${label('/device/beta')} (${nominal}), got ${max}` });
  return issues;
}

/** An offset target states what it limits: the offset, the drift, or both (the number of standard deviations alone checks nothing). */
function offsetLimitIssues(spec: Pick<Spec, 'offset'>, label: Label): ValidationIssue[] {
  if (!spec.offset || spec.offset.maxV !== undefined || spec.offset.driftMaxVPerC !== undefined) return [];
  return [{ path: '/offset/maxV', message: `is required unless ${label('/offset/driftMaxVPerC')} is given (leave the input offset out to check neither)` }];
}

/** A noise target is a density at a frequency: either one alone checks nothing. */
function noisePairIssues(spec: Pick<Spec, 'noise'>, label: Label): ValidationIssue[] {
  if (!spec.noise) return [];
  const fields = ['maxVPerRtHz', 'atFrequencyHz'] as const;
  return fields
    .filter((field) => spec.noise?.[field] === undefined)
    .map((field) => {
      const other = fields.find((f) => f !== field)!;
      return { path: `/noise/${field}`, message: `is required with ${label(`/noise/${other}`)} (leave the input noise out to check no noise)` };
    });
}

/** The smallest resistance a resistor field allows, ohms (1 mΩ, as the schema's resistor fields). */
const MIN_RESISTANCE_OHM = 1e-3;

/** The pair emitter resistor is 0 (none) or a resistor of at least 1 mΩ, like every other resistor field. */
function optionalResistanceIssues(path: string, valueOhm: number | undefined): ValidationIssue[] {
  if (valueOhm === undefined || valueOhm === 0 || valueOhm >= MIN_RESISTANCE_OHM) return [];
  return [{ path, message: `must be 0 (none) or at least 1 mΩ, got ${valueOhm} Ω` }];
}

/** The negative rail must be below the positive one. */
function railOrderIssues(supply: Supply, label: Label): ValidationIssue[] {
  if (supply.negativeV < supply.positiveV) return [];
  return [{ path: '/supply/negativeV', message: `must be below ${label('/supply/positiveV')} (${volts(supply.positiveV)}), got ${volts(supply.negativeV)}` }];
}

/** A DC voltage strictly between the rails (assumes the rails are in order). */
function insideRailsIssues(path: string, valueV: number, supply: Supply, label: Label): ValidationIssue[] {
  if (valueV >= supply.positiveV) {
    return [{ path, message: `must be below ${label('/supply/positiveV')} (${volts(supply.positiveV)}), got ${volts(valueV)}` }];
  }
  if (valueV <= supply.negativeV) {
    return [{ path, message: `must be above ${label('/supply/negativeV')} (${volts(supply.negativeV)}), got ${volts(valueV)}` }];
  }
  return [];
}

function volts(valueV: number): string {
  return `${valueV} V`;
}

/** Drops binary noise from a difference (12 - 0.1 is 11.9, not 11.899999999999999). */
function tidy(value: number): number {
  return Number(value.toPrecision(12));
}
