/**
 * Fingerprints of what a verification simulated (shared/verification/binding.ts): sha256 of the
 * canonical JSON of the design's values, the spec version, the engine and rule-set versions.
 */
import { createHash } from 'node:crypto';
import { bindingInputs, canonicalJson, type BindingInputs, type DesignBinding } from '#shared/verification/binding';
import type { Design } from '#shared/engine/types';
import type { RecommendResult } from '#shared/engine/recommend';
import { currentDesign, type CurrentDesign, type DecisionLike } from '#shared/workflow/current-design';

export function fingerprint(inputs: BindingInputs): string {
  return createHash('sha256').update(canonicalJson(inputs)).digest('hex');
}

/** The binding of a design: its normalised inputs and their fingerprint. */
export function designBinding(input: { topology: string; design: Design; specVersionId: number; specVersion: number; engineVersion: string; rulesetVersion: string }): DesignBinding {
  const inputs = bindingInputs(input);
  return { fingerprint: fingerprint(inputs), inputs };
}

/** A decision as the API shows it, with the versions that checked it. */
export type BoundDecision = DecisionLike & { engineVersion: string | null; rulesetVersion: string | null };

/**
 * The proposal's current design (shared/workflow/current-design.ts) with its binding: the inputs
 * a verification of exactly this design would record. Options are bound to the ranking's engine
 * and rule set, a designer's own values to those that checked them when decided.
 */
export function boundCurrentDesign(
  proposal: { engineVersion: string; rulesetVersion: string; specVersionId: number },
  specVersion: number,
  result: RecommendResult,
  decisions: readonly BoundDecision[],
): (CurrentDesign & { binding: DesignBinding | null }) | null {
  const current = currentDesign(result, decisions);
  if (!current) return null;
  const decision = current.ownValues ? decisions.find((d) => d.id === current.decisionId) : undefined;
  const binding = current.design
    ? designBinding({
        topology: current.topology,
        design: current.design,
        specVersionId: proposal.specVersionId,
        specVersion,
        engineVersion: decision?.engineVersion ?? proposal.engineVersion,
        rulesetVersion: decision?.rulesetVersion ?? proposal.rulesetVersion,
      })
    : null;
  return { ...current, binding };
}
