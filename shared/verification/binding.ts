/**
 * Binding a verification result to the design it simulated. Each result records the exact
 * inputs (the design's values, the spec version, the engine and rule-set versions whose
 * predictions it was compared with) and their fingerprint: sha256 of `canonicalJson(inputs)`,
 * computed on the server (`api/verification/fingerprint.ts`). A result is current for a design
 * when the fingerprints are equal; otherwise it is stale, and `bindingChanges` says what changed
 * in words. Pure: no I/O, no hashing (the browser compares the fingerprints the server sends).
 */
import type { Design } from '../engine/types';
import { topologyName } from '../engine/topologies';
import { formatQuantity } from '../units/format-quantity';

/** What a verification result is bound to. */
export interface BindingInputs {
  topology: string;
  /** The design's values with the documented defaults filled in (`normalizedDesign`). */
  design: Design;
  specVersionId: number;
  specVersion: number;
  /** The engine and rule set whose predictions the simulation is compared with. */
  engineVersion: string;
  rulesetVersion: string;
}

export interface DesignBinding {
  /** sha256 (hex) of `canonicalJson(inputs)`. */
  fingerprint: string;
  inputs: BindingInputs;
}

/** JSON with object keys sorted at every level and undefined members left out: equal values give equal text. */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value) ?? 'null';
  if (Array.isArray(value)) return `[${value.map((v) => (v === undefined ? 'null' : canonicalJson(v))).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

/**
 * The design with the schema's defaults written out, so "left out" and "0" fingerprint alike.
 * Fields added later (version 2 of the contract) are instead left out when at their defaults, so a
 * design without them fingerprints as it did before they existed (stored results stay current).
 */
export function normalizedDesign(design: Design): Design {
  const normalized: Design = {
    ...design,
    collectorMismatch: design.collectorMismatch ?? 0,
    pairEmitterResistanceOhm: design.pairEmitterResistanceOhm ?? 0,
    pairSaturationCurrentMismatch: design.pairSaturationCurrentMismatch ?? 0,
    inputCommonModeV: design.inputCommonModeV ?? 0,
    temperatureC: design.temperatureC ?? 27,
    tailCapacitanceF: design.tailCapacitanceF ?? 0,
  };
  for (const field of ['loadCapacitanceF', 'sourceResistanceOhm', 'pairBetaMismatch', 'pairEarlyVoltageMismatch'] as const) {
    if (normalized[field] === 0) delete normalized[field];
  }
  if (normalized.frequenciesHz?.length === 0) delete normalized.frequenciesHz;
  if (normalized.device.model && Object.values(normalized.device.model).every((v) => v === undefined)) {
    const { model: _empty, ...device } = normalized.device;
    normalized.device = device;
  }
  return normalized;
}

export function bindingInputs(input: { topology: string; design: Design; specVersionId: number; specVersion: number; engineVersion: string; rulesetVersion: string }): BindingInputs {
  return { ...input, design: normalizedDesign(input.design) };
}

/** Short names and units of design values, as a designer writes them on a schematic. */
const VALUE_NAMES: Record<string, [string, string]> = {
  collectorResistanceOhm: ['RC', 'Ω'],
  collectorMismatch: ['RC mismatch', ''],
  pairEmitterResistanceOhm: ['pair RE', 'Ω'],
  pairSaturationCurrentMismatch: ['pair IS mismatch', ''],
  inputCommonModeV: ['input common mode', 'V'],
  temperatureC: ['temperature', '°C'],
  tailCapacitanceF: ['Ct', 'F'],
  'supply.positiveV': ['V+', 'V'],
  'supply.negativeV': ['V−', 'V'],
  'tail.resistanceOhm': ['tail R', 'Ω'],
  'tail.referenceResistanceOhm': ['Rref', 'Ω'],
  'tail.emitterResistanceOhm': ['mirror RE', 'Ω'],
  'device.beta': ['β', ''],
  'device.earlyVoltageV': ['VAF', 'V'],
  'device.saturationCurrentA': ['IS', 'A'],
  'device.vbeOnV': ['VBE(on)', 'V'],
};

function leaves(value: unknown, prefix = ''): Map<string, unknown> {
  const out = new Map<string, unknown>();
  if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
    for (const [k, v] of Object.entries(value as Record<string, unknown>)) for (const [p, leaf] of leaves(v, prefix ? `${prefix}.${k}` : k)) out.set(p, leaf);
  } else out.set(prefix, value);
  return out;
}

function valueText(path: string, value: unknown): string {
  if (value === undefined || value === null) return 'none';
  if (Array.isArray(value)) return value.length === 0 ? 'none' : value.join(', ');
  const unit = VALUE_NAMES[path]?.[1];
  if (typeof value === 'number') return unit === '°C' ? `${value} °C` : unit !== undefined ? formatQuantity(value, unit) : String(value);
  return String(value);
}

/**
 * What differs between the inputs a result simulated and the current design's, in words, e.g.
 * "simulated RC 10 kΩ, decided 12 kΩ" or "spec version 3, now 4". Empty when nothing does.
 */
export function bindingChanges(simulated: BindingInputs, current: BindingInputs, currentWord = 'decided'): string[] {
  const changes: string[] = [];
  if (simulated.specVersionId !== current.specVersionId) changes.push(`spec version ${simulated.specVersion}, now ${current.specVersion}`);
  if (simulated.topology !== current.topology) changes.push(`simulated ${topologyName(simulated.topology)}, ${currentWord} ${topologyName(current.topology)}`);
  else {
    const before = leaves(normalizedDesign(simulated.design));
    const after = leaves(normalizedDesign(current.design));
    for (const path of new Set([...before.keys(), ...after.keys()])) {
      const a = before.get(path);
      const b = after.get(path);
      if (a === b || (Array.isArray(a) && Array.isArray(b) && canonicalJson(a) === canonicalJson(b))) continue;
      const name = VALUE_NAMES[path]?.[0] ?? path;
      changes.push(`simulated ${name} ${valueText(path, a)}, ${currentWord} ${valueText(path, b)}`);
    }
  }
  if (simulated.engineVersion !== current.engineVersion) changes.push(`engine ${simulated.engineVersion}, now ${current.engineVersion}`);
  if (simulated.rulesetVersion !== current.rulesetVersion) changes.push(`rule set ${simulated.rulesetVersion.slice(0, 12)}, now ${current.rulesetVersion.slice(0, 12)}`);
  return changes;
}

/** How a stored result stands against the current design. */
export type Freshness =
  /** Simulated exactly the current design. */
  | { state: 'current' }
  /** Simulated something else; `changes` says what (never empty). */
  | { state: 'stale'; changes: string[] }
  /** Stored before results recorded what they simulated. */
  | { state: 'unbound' };

/** The words shown for a result stored before fingerprints were recorded. */
export const UNBOUND_WORDS = 'Not bound to a design: simulated before fingerprints were recorded.';

export function freshness(binding: DesignBinding | null | undefined, current: DesignBinding | null | undefined, currentWord = 'decided'): Freshness {
  if (!binding) return { state: 'unbound' };
  if (current && binding.fingerprint === current.fingerprint) return { state: 'current' };
  if (!current) return { state: 'stale', changes: ['there is no current design to compare with'] };
  const changes = bindingChanges(binding.inputs, current.inputs, currentWord);
  return { state: 'stale', changes: changes.length > 0 ? changes : ['the recorded inputs differ'] };
}

/** One line for a stale or unbound result: "Stale: simulated RC 10 kΩ, decided 12 kΩ." */
export function freshnessText(state: Freshness): string | null {
  if (state.state === 'current') return null;
  if (state.state === 'unbound') return UNBOUND_WORDS;
  return `Stale: ${state.changes.join('; ')}.`;
}

/** What a result is matched against: the current design's topology, kind and binding. */
export interface DesignToMatch {
  topology: string;
  ownValues: boolean;
  binding: DesignBinding | null;
}

/**
 * The result about a design among one job's results: the one that simulated exactly it, else the
 * one that stood for it (the designer's own values for an override, the ranked option of its
 * topology otherwise), which is then stale. Null when the job simulated nothing of the kind.
 */
export function resultForDesign<T extends { topology: string; source: 'option' | 'decision'; binding?: DesignBinding | null }>(results: readonly T[], design: DesignToMatch): T | null {
  const exact = design.binding ? results.find((r) => r.binding?.fingerprint === design.binding!.fingerprint) : undefined;
  if (exact) return exact;
  return results.find((r) => (design.ownValues ? r.source === 'decision' : r.source === 'option' && r.topology === design.topology)) ?? null;
}
