import { useQueryClient } from '@tanstack/react-query';
import { useId, useRef, useState, type FormEvent } from 'react';
import type { TopologyId } from '../../../../../../shared/engine/types';
import { Button } from '../../../../components/ui/button';
import { ApiError } from '../../../../lib/api';
import type { DecisionInput, Proposal } from '../../../../lib/api-types';
import { cn } from '../../../../lib/cn';
import type { useDecideMutation } from '../../api/decision-mutations';
import { proposalKeys } from '../../api/proposal-queries';
import { ChoiceOptions } from './choice-options';
import { decisionStart, startingDesign, type DecisionKind } from './decision-draft';
import { topologyTitle, type FieldKey } from './design-fields';
import { designFromDraft, draftFromDesign, fieldKeyOfPath, type OverrideDraft } from './override-draft';
import { OverrideEditor } from './override-editor';

type ServerErrors = Partial<Record<FieldKey | 'reason' | 'topology', string>>;

/**
 * The designer's decision. Everything typed stays in this form's state until the server
 * accepts it: a refused or failed request leaves the choice, the values and the reason as they were.
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
  const reasonRef = useRef<HTMLTextAreaElement>(null);
  const formRef = useRef<HTMLFormElement>(null);
  const reasonId = useId();

  const reasonRequired = kind !== 'accept';
  const reasonMissing = reasonRequired && reason.trim() === '';
  const overrideDesign = kind === 'override' && draft ? designFromDraft(draft) : null;
  const chosenMissing = kind === 'choose' && chosen === '';
  const reasonError = serverErrors.reason ?? (attempted && reasonMissing ? 'Give a reason: the reviewer reads it before approving anything but the recommendation.' : undefined);
  const generalError = mutation.error;

  const changeKind = (next: DecisionKind) => {
    setKind(next);
    if (next === 'override' && !draftTouched) {
      const design = startingDesign(proposal, kind === 'choose' && chosen ? chosen : undefined);
      setDraft(design ? draftFromDesign(design) : null);
    }
  };

  const changeDraft = (next: OverrideDraft) => {
    setDraft(next);
    setDraftTouched(true);
    // The values changed, so the server's word on the old ones no longer applies; the reason's and topology's still do.
    setServerErrors(({ reason, topology }) => ({ ...(reason ? { reason } : {}), ...(topology ? { topology } : {}) }));
  };

  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
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
    const body: DecisionInput = { kind, ...(reason.trim() ? { reason: reason.trim() } : {}) };
    if (kind === 'choose') body.topology = chosen as TopologyId;
    if (kind === 'override') body.design = overrideDesign!;
    setServerErrors({});
    mutation.mutate(body, { onError: (error) => setServerErrors(serverErrorsOf(error)) });
  };

  const what =
    kind === 'accept'
      ? `accept the ${topologyTitle(proposal.result.recommended).toLowerCase()}`
      : kind === 'choose'
        ? chosen
          ? `choose the ${topologyTitle(chosen).toLowerCase()}`
          : 'choose an option'
        : `own values (${topologyTitle(draft?.topology).toLowerCase()})`;

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
            <OverrideEditor proposal={proposal} draft={draft} onDraftChange={changeDraft} serverErrors={serverErrors} />
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
          className={cn('w-full rounded-md border bg-sheet px-3 py-2 dark:bg-night', reasonError ? 'border-short dark:border-short-soft' : 'border-rule dark:border-night-rule')}
        />
        <p id={`${reasonId}-hint`} className={cn('mt-1 text-xs', reasonError ? 'text-short dark:text-short-soft' : 'text-ink-soft dark:text-night-ink-soft')}>
          {reasonError ? `✕ ${reasonError}` : 'Kept with the decision in the audit trail.'}
        </p>
      </div>

      {generalError && <SubmitError error={generalError} proposalId={proposal.id} />}

      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={mutation.isPending}>
          {mutation.isPending ? 'Recording…' : `Record decision: ${what}`}
        </Button>
        {kind === 'override' && <span className="text-xs text-ink-soft dark:text-night-ink-soft">The server runs every rule on your values; this takes a few seconds.</span>}
      </div>
    </form>
  );
}

/** Why the decision was not recorded, in place; for a 409, a way to see what changed meanwhile. */
function SubmitError({ error, proposalId }: { error: Error; proposalId: number }) {
  const queryClient = useQueryClient();
  const status = error instanceof ApiError ? error.status : 0;
  const unplaced = error instanceof ApiError && status === 400 ? error.details.filter((d) => d.path !== '/reason' && d.path !== '/topology' && !fieldKeyOfPath(d.path)) : [];
  const title = status === 409 ? 'The proposal cannot take this decision now' : status === 400 ? 'The server refused the decision: see the marked fields' : 'The decision was not recorded';
  return (
    <div role="alert" className="rounded-md border border-short/40 bg-short-soft p-3 text-sm text-short dark:bg-short/20 dark:text-short-soft">
      <p className="font-medium">{title}</p>
      <p className="mt-1">{error.message}</p>
      {unplaced.length > 0 && (
        <ul className="mt-1 list-inside list-disc">
          {unplaced.map((d) => (
            <li key={`${d.path}${d.message}`}>
              <code>{d.path || '(request)'}</code>: {d.message}
            </li>
          ))}
        </ul>
      )}
      <p className="mt-1 text-xs">Your choice, values and reason are still here.</p>
      {status === 409 && (
        <button type="button" className="mt-1 text-xs font-medium underline" onClick={() => void queryClient.invalidateQueries({ queryKey: proposalKeys.detail(proposalId) })}>
          Show the proposal as it is now (discards this unsent decision)
        </button>
      )}
    </div>
  );
}

/** A refused decision's field messages (400 with paths), by field; nothing for other errors. */
function serverErrorsOf(error: unknown): ServerErrors {
  if (!(error instanceof ApiError) || error.status !== 400) return {};
  const errors: ServerErrors = {};
  for (const { path, message } of error.details) {
    if (path === '/reason') errors.reason = `The server says: ${message}`;
    else if (path === '/topology') errors.topology = `The server says: ${message}`;
    else {
      const key = fieldKeyOfPath(path);
      if (key) errors[key] = `The server says: ${message}`;
    }
  }
  return errors;
}
