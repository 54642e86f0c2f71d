import { useId, useRef, useState, type FormEvent } from 'react';
import type { TopologyId } from '#shared/engine/types';
import { Button } from '../../../../components/ui/button';
import type { DecisionInput, Proposal } from '#shared/api/proposals';
import { cn } from '../../../../lib/cn';
import type { useDecideMutation } from '../../api/decision-mutations';
import { ChoiceOptions } from './choice-options';
import { decisionStart, startingDesign, type DecisionKind } from './decision-draft';
import { topologyNameInText } from '../../../../lib/topology-names';
import { designFromDraft, draftFromDesign, type OverrideDraft } from './override-draft';
import { OverrideConfirmation } from './override-confirmation';
import { OverrideEditor } from './override-editor';
import { serverErrorsOf, SubmitError, type ServerErrors } from './submit-error';
import { shortfallOf, useFullCheck } from './use-full-check';

/**
 * The designer's decision. Everything typed stays in this form's state until the server
 * accepts it: a refused or failed request leaves the choice, the values and the reason as they were.
 * Own values that are unchecked, or short on a blocking rule, are recorded after a second thought.
 */
export function DecisionForm({ proposal, mutation }: { proposal: Proposal; mutation: ReturnType<typeof useDecideMutation> }) {
  const start = useState(() => decisionStart(proposal))[0];
  const [kind, setKind] = useState<DecisionKind>(start.kind);
  const [chosen, setChosen] = useState<TopologyId | ''>(start.chosen);
  const [draft, setDraft] = useState<OverrideDraft | null>(start.draft);
  const [draftTouched, setDraftTouched] = useState(start.draft !== null);
  const [reason, setReason] = useState('');
  const [attempted, setAttempted] = useState(false);
  const [serverErrors, setServerErrors] = useState<ServerErrors>({});
  /** The design (as JSON) the designer was asked to confirm; the question lapses once the values change. */
  const [confirmFor, setConfirmFor] = useState<string | null>(null);
  const reasonRef = useRef<HTMLTextAreaElement>(null);
  const formRef = useRef<HTMLFormElement>(null);
  const reasonId = useId();

  const reasonRequired = kind !== 'accept';
  const reasonMissing = reasonRequired && reason.trim() === '';
  const overrideDesign = kind === 'override' && draft ? designFromDraft(draft) : null;
  const fullCheck = useFullCheck(proposal.id, overrideDesign);
  const shortfall = kind === 'override' ? shortfallOf(fullCheck) : null;
  const confirming = shortfall !== null && confirmFor !== null && confirmFor === fullCheck.designJson;
  const chosenMissing = kind === 'choose' && chosen === '';
  const reasonError = serverErrors.reason ?? (attempted && reasonMissing ? 'Give a reason: the reviewer reads it before approving anything but the recommendation.' : undefined);
  const generalError = mutation.error;

  const changeKind = (next: DecisionKind) => {
    setKind(next);
    setConfirmFor(null);
    if (next === 'override' && !draftTouched) {
      const design = startingDesign(proposal, kind === 'choose' && chosen ? chosen : undefined);
      setDraft(design ? draftFromDesign(design) : null);
    }
  };

  const changeDraft = (next: OverrideDraft) => {
    setDraft(next);
    setDraftTouched(true);
    setConfirmFor(null);
    // The values changed, so the server's word on the old ones no longer applies; the reason's and topology's still do.
    setServerErrors(({ reason, topology }) => ({ ...(reason ? { reason } : {}), ...(topology ? { topology } : {}) }));
  };

  const submit = (confirmed: boolean) => {
    setAttempted(true);
    if (reasonMissing) {
      reasonRef.current?.focus();
      return;
    }
    if (chosenMissing) return;
    if (kind === 'override' && !overrideDesign) {
      formRef.current?.querySelector<HTMLInputElement>('input[aria-invalid="true"]')?.focus();
      return;
    }
    if (shortfall && !confirmed) {
      setConfirmFor(fullCheck.designJson);
      return;
    }
    setConfirmFor(null);
    const body: DecisionInput = { kind, ...(reason.trim() ? { reason: reason.trim() } : {}) };
    if (kind === 'choose') body.topology = chosen as TopologyId;
    if (kind === 'override') body.design = overrideDesign!;
    setServerErrors({});
    mutation.mutate(body, { onError: (error) => setServerErrors(serverErrorsOf(error)) });
  };

  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    submit(false);
  };

  /** Confirmed: recorded as it stands, focus kept on the record button rather than lost with the question. */
  const recordAnyway = () => {
    submit(true);
    formRef.current?.querySelector<HTMLButtonElement>('button[type="submit"]')?.focus();
  };

  /** Back to the values: to the full check when it has not run on them, else to the record button. */
  const keepEditing = () => {
    setConfirmFor(null);
    const form = formRef.current;
    const checkButton = form?.querySelector<HTMLButtonElement>('button[data-full-check]:not(:disabled)');
    (shortfall?.kind === 'unchecked' && checkButton ? checkButton : form?.querySelector<HTMLButtonElement>('button[type="submit"]'))?.focus();
  };

  const what =
    kind === 'accept'
      ? `accept the ${topologyNameInText(proposal.result.recommended)}`
      : kind === 'choose'
        ? chosen
          ? `choose the ${topologyNameInText(chosen)}`
          : 'choose an option'
        : `own values (${topologyNameInText(draft?.topology)})`;

  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Decision">
      <ChoiceOptions
        proposal={proposal}
        kind={kind}
        onKindChange={changeKind}
        chosen={chosen}
        onChosenChange={(topology) => {
          setChosen(topology);
          setServerErrors(({ topology: _dropped, ...rest }) => rest);
        }}
        chosenError={serverErrors.topology ?? (attempted && chosenMissing ? 'Pick the option you choose.' : undefined)}
        override={
          draft ? (
            <OverrideEditor proposal={proposal} draft={draft} onDraftChange={changeDraft} serverErrors={serverErrors} fullCheck={fullCheck} />
          ) : (
            <p className="text-sm">No ranked option has a sized design to start from.</p>
          )
        }
      />

      <div className="text-sm">
        <label htmlFor={reasonId} className="mb-1 block font-medium">
          Reason <span className="font-normal text-ink-soft dark:text-night-ink-soft">({reasonRequired ? 'required' : 'optional when accepting'})</span>
        </label>
        <textarea
          id={reasonId}
          ref={reasonRef}
          value={reason}
          onChange={(e) => {
            setReason(e.target.value);
            setServerErrors(({ reason: _dropped, ...rest }) => rest);
          }}
          rows={3}
          maxLength={4000}
          required={reasonRequired}
          aria-invalid={reasonError ? true : undefined}
          aria-describedby={`${reasonId}-hint`}
          placeholder={reasonRequired ? 'What the ranking does not weigh: parts on hand, layout, bench experience…' : undefined}
          className={cn('w-full rounded-md border bg-sheet px-3 py-2 dark:bg-night', reasonError ? 'border-short dark:border-short-bright' : 'border-rule dark:border-night-rule')}
        />
        <p id={`${reasonId}-hint`} className={cn('mt-1 text-xs', reasonError ? 'text-short dark:text-short-bright' : 'text-ink-soft dark:text-night-ink-soft')}>
          {reasonError ? `✕ ${reasonError}` : 'Kept with the decision in the audit trail.'}
        </p>
      </div>

      {generalError && <SubmitError error={generalError} proposalId={proposal.id} />}
      {confirming && <OverrideConfirmation shortfall={shortfall} onConfirm={recordAnyway} onCancel={keepEditing} pending={mutation.isPending} />}

      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={mutation.isPending}>
          {mutation.isPending ? 'Recording…' : `Record decision: ${what}`}
        </Button>
        {kind === 'override' && <span className="text-xs text-ink-soft dark:text-night-ink-soft">The server runs every rule on your values; this takes a few seconds.</span>}
      </div>
    </form>
  );
}
