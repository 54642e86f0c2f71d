/**
 * The full check of the edited values: the server's evaluation over every rule and corner, Monte
 * Carlo included, as an override of them would be recorded with. Each answer is kept with the
 * design it was asked for, so a later edit marks it out of date instead of passing it off as the
 * verdict on the values now in the fields.
 */
import { useState } from 'react';
import type { Design } from '#shared/engine/types';
import type { OptionEvaluation } from '#shared/api/proposals';
import { useOverrideCheckMutation } from '../../api/decision-mutations';
import { checkTitle } from '../../../../lib/checks';
import { fieldErrorsOf } from './override-draft';

export type CheckOutcome = { designJson: string; result: OptionEvaluation; error?: undefined } | { designJson: string; result?: undefined; error: Error };

/** Why an override should be confirmed before it is recorded; null when its check passes. */
export type Shortfall = { kind: 'unchecked' | 'checking' | 'not-completed' } | { kind: 'short'; rules: string[] };

export function useFullCheck(proposalId: number, design: Design | null) {
  const mutation = useOverrideCheckMutation(proposalId);
  const [outcome, setOutcome] = useState<CheckOutcome | null>(null);
  const designJson = design ? JSON.stringify(design) : null;
  const pendingJson = mutation.isPending && mutation.variables ? JSON.stringify(mutation.variables) : null;
  const current = outcome !== null && outcome.designJson === designJson;
  const checking = pendingJson !== null && pendingJson === designJson;

  const run = () => {
    if (!design || !designJson) return;
    // Only the latest request's callbacks fire, so an answer for older values never lands on newer ones.
    mutation.mutate(design, {
      onSuccess: (result) => setOutcome({ designJson, result }),
      onError: (error) => setOutcome({ designJson, error }),
    });
  };

  return {
    designJson,
    outcome,
    /** The outcome is for the values now in the fields. */
    current,
    /** A check of the values now in the fields is running. */
    checking,
    canRun: design !== null && !checking,
    run,
    /** A refusal's messages by field, while the refused values are still the ones in the fields. */
    fieldErrors: current ? fieldErrorsOf(outcome.error) : {},
  };
}

export type FullCheck = ReturnType<typeof useFullCheck>;

/** What the values in the fields lack before an override of them is recorded without a second thought. */
export function shortfallOf(check: FullCheck): Shortfall | null {
  if (check.checking) return { kind: 'checking' };
  if (!check.current || !check.outcome) return { kind: 'unchecked' };
  if (!check.outcome.result) return { kind: 'not-completed' };
  const option = check.outcome.result;
  if (option.passes) return null;
  const failing = option.checks.filter((c) => c.severity === 'blocking' && !c.passed);
  return { kind: 'short', rules: failing.length > 0 ? failing.map(checkTitle) : [option.error ?? 'a blocking check'] };
}
