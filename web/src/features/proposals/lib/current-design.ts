/**
 * The proposal's current design as the app shows it: the one shared function
 * (shared/workflow/current-design.ts) on the proposal's ranking and decisions, with the binding
 * the server sent (what a verification of exactly this design records). Pure.
 */
import { currentDesign, type CurrentDesign } from '#shared/workflow/current-design';
import { freshness, resultForDesign, type DesignBinding, type Freshness } from '#shared/verification/binding';
import type { OptionVerification } from '#shared/verification/types';
import type { Proposal } from '#shared/api/proposals';

export type ShownDesign = CurrentDesign & { binding: DesignBinding | null };

export function proposalCurrentDesign(proposal: Proposal): ShownDesign | null {
  const current = currentDesign(proposal.result, proposal.decisions);
  if (!current) return null;
  const binding = proposal.currentDesign?.binding ?? null;
  return { ...current, binding: binding && binding.inputs.topology === current.topology ? binding : null };
}

/**
 * How one simulated result stands against the current design: only the result about the current
 * design (and any result of the designer's own values) gets a verdict; other ranked options are
 * simulated as ranked and need none (null).
 */
export function resultFreshness(option: OptionVerification, all: readonly OptionVerification[], current: ShownDesign | null): Freshness | null {
  if (!current) return null;
  const about = resultForDesign(all, current);
  if (option !== about && option.source !== 'decision') return null;
  return freshness(option.binding, current.binding, current.basis === 'decision' ? 'decided' : 'recommended');
}
