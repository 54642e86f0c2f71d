/**
 * The spec form's PNP section as data: which of the chosen tails need a PNP transistor
 * (the catalogue's `needsDevice: 'pnp'`, today the PTAT source), so the form shows `device.pnp`
 * while one is chosen (or while it holds values) and the cross-field rule asks for it.
 */
import specSchema from '#shared/schema/spec.schema.json';
import { isTopologyId, TOPOLOGIES, TOPOLOGY_CATALOGUE, type TopologyId } from '#shared/engine/topologies';

/** The catalogue's tails that need a PNP, in simplicity order. */
export const PNP_TAILS: readonly TopologyId[] = TOPOLOGIES.filter((id) => TOPOLOGY_CATALOGUE[id].needsDevice === 'pnp');

/** The options a spec compares when it names none: the schema's default. */
const DEFAULT_TOPOLOGIES = specSchema.properties.topologies.default as readonly string[];

/** The tail options of the form's choice (the schema's default when it has none). */
export function chosenTopologies(draft: Record<string, unknown>): TopologyId[] {
  const chosen = Array.isArray(draft.topologies) ? (draft.topologies as unknown[]) : DEFAULT_TOPOLOGIES;
  return chosen.filter(isTopologyId);
}

/** Whether the draft describes a PNP stage (`device.family` "pnp"). */
export function isPnpStage(draft: Record<string, unknown>): boolean {
  const device = draft.device as Record<string, unknown> | undefined;
  return device?.family === 'pnp';
}

/** The tails of the form's choice that need the PNP (none for a PNP stage, which cannot take them). */
export function tailsNeedingPnp(draft: Record<string, unknown>): TopologyId[] {
  if (isPnpStage(draft)) return [];
  return chosenTopologies(draft).filter((id) => PNP_TAILS.includes(id));
}

/** The PNP transistors of those tails, by their reference designators ("Q7, Q8"). */
export function pnpTransistorNames(tails: readonly TopologyId[]): string[] {
  return [...new Set(tails.flatMap((id) => TOPOLOGY_CATALOGUE[id].transistors.filter((q) => q.type === 'pnp').map((q) => q.name)))];
}

/** What the PNP section reads from the form context. */
export interface PnpChoiceContext {
  /** The chosen tails that need a PNP (empty: the section shows only when it holds values). */
  pnpTails?: readonly TopologyId[];
  /** The stage itself is a PNP one: the section's values are not read, and the device library (NPN cards) is not offered. */
  pnpStage?: boolean;
}
