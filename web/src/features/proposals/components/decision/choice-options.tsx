import { useId, type ReactNode } from 'react';
import type { TopologyId } from '#shared/engine/types';
import { Quantity } from '../../../../components/ui/quantity';
import { Verdict } from '../../../../components/ui/verdict';
import type { OptionEvaluation, Proposal } from '#shared/api/proposals';
import { cn } from '../../../../lib/cn';
import { blockingFailures } from './decided-option';
import type { DecisionKind } from './decision-draft';
import { choosableOptions } from './decision-draft';
import { topologyName } from '../../../../lib/topology-names';

/** One ranked option in words: "#2 Wilson mirror — passes" or "— short on 1 blocking check". */
export function optionLabel(option: OptionEvaluation): string {
  const failures = blockingFailures(option);
  const outcome = !option.design ? 'could not be sized' : option.passes ? 'passes' : `short on ${failures} blocking check${failures === 1 ? '' : 's'}`;
  return `#${option.rank} ${topologyName(option.topology)} — ${outcome}`;
}

/** The three ways to decide, as one radio group; the chosen way's own controls open beneath it. */
export function ChoiceOptions({
  proposal,
  kind,
  onKindChange,
  chosen,
  onChosenChange,
  chosenError,
  override,
}: {
  proposal: Proposal;
  kind: DecisionKind;
  onKindChange: (kind: DecisionKind) => void;
  chosen: TopologyId | '';
  onChosenChange: (topology: TopologyId) => void;
  chosenError?: string;
  override: ReactNode;
}) {
  const name = useId();
  const recommended = proposal.result.recommended;
  const recommendedOption = proposal.result.options.find((o) => o.topology === recommended) ?? null;
  const choosable = choosableOptions(proposal);
  return (
    <fieldset className="min-w-0 space-y-2">
      <legend className="mb-2 text-sm font-medium">How do you decide?</legend>
      <Choice name={name} value="accept" kind={kind} onKindChange={onKindChange} disabled={!recommended} title="Accept the recommendation">
        {recommendedOption ? (
          <>
            {topologyName(recommended)}: {proposal.result.summary.replace(/^[a-z-]+: /, '')}
          </>
        ) : (
          <>No option passes every blocking check, so there is nothing to accept: choose an option anyway (and say why) or use your own values.</>
        )}
      </Choice>
      <Choice name={name} value="choose" kind={kind} onKindChange={onKindChange} title="Choose another ranked option">
        Take one of the engine’s other sized options as it stands. A reason is required.
      </Choice>
      {kind === 'choose' && <ChooseOption options={choosable} chosen={chosen} onChange={onChosenChange} error={chosenError} />}
      <Choice name={name} value="override" kind={kind} onKindChange={onKindChange} title="Use my own values">
        Start from a ranked option and change its resistors (or its topology); the server checks your values with every rule. A reason is required.
      </Choice>
      {kind === 'override' && <div className="ml-7 min-w-0 rounded-md border border-rule p-3 dark:border-night-rule">{override}</div>}
    </fieldset>
  );
}

function Choice({ name, value, kind, onKindChange, disabled, title, children }: { name: string; value: DecisionKind; kind: DecisionKind; onKindChange: (kind: DecisionKind) => void; disabled?: boolean; title: string; children: ReactNode }) {
  const id = `${name}-${value}`;
  return (
    // A choice not open now says so by its dashed edge and muted title, never by fading the whole
    // box: its text (why it is not open) must stay as readable as the rest of the page.
    <div className={cn('flex items-start gap-3 rounded-md border p-3', kind === value ? 'border-fern bg-fern-soft/40 dark:border-fern-soft dark:bg-night' : 'border-rule dark:border-night-rule', disabled && 'border-dashed')}>
      <input id={id} type="radio" name={name} value={value} checked={kind === value} disabled={disabled} onChange={() => onKindChange(value)} aria-describedby={`${id}-more`} className="mt-1 accent-fern disabled:cursor-not-allowed" />
      <div className="min-w-0 text-sm">
        <label htmlFor={id} className={cn('font-medium', disabled && 'cursor-not-allowed text-ink-soft dark:text-night-ink-soft')}>
          {title}
        </label>
        <p id={`${id}-more`} className="text-ink-soft dark:text-night-ink-soft">
          {children}
        </p>
      </div>
    </div>
  );
}

function ChooseOption({ options, chosen, onChange, error }: { options: OptionEvaluation[]; chosen: TopologyId | ''; onChange: (topology: TopologyId) => void; error?: string }) {
  const id = useId();
  const option = options.find((o) => o.topology === chosen) ?? null;
  const failing = option ? option.checks.filter((c) => !c.passed && c.severity === 'blocking') : [];
  return (
    <div className="ml-7 min-w-0 space-y-2 rounded-md border border-rule p-3 text-sm dark:border-night-rule">
      <label htmlFor={id} className="block font-medium">
        Ranked option
      </label>
      <select
        id={id}
        value={chosen}
        onChange={(e) => onChange(e.target.value as TopologyId)}
        aria-invalid={error ? true : undefined}
        aria-describedby={`${id}-about`}
        className="w-full max-w-md rounded-md border border-rule bg-sheet px-3 py-2 dark:border-night-rule dark:bg-night"
      >
        <option value="" disabled>
          Pick an option…
        </option>
        {options.map((o) => (
          <option key={o.topology} value={o.topology} disabled={!o.design}>
            {optionLabel(o)}
          </option>
        ))}
      </select>
      <div id={`${id}-about`}>
        {error && <p className="text-short dark:text-short-bright">✕ {error}</p>}
        {option && (
          <div className="space-y-1">
            <OptionFigures option={option} />
            {failing.length > 0 && (
              <ul className="space-y-1">
                {failing.map((c) => (
                  <li key={c.rule} className="flex items-start gap-2">
                    <Verdict kind="short" />
                    <span>{c.reason}</span>
                  </li>
                ))}
              </ul>
            )}
          </div>
        )}
      </div>
    </div>
  );
}

/** The option's rejection at the spec frequency in both senses (they differ by tens of dB), and its tail current. */
function OptionFigures({ option }: { option: OptionEvaluation }) {
  const figures = option.figures;
  if (!figures) return <p className="text-ink-soft dark:text-night-ink-soft">{option.error ?? 'No figures: this option could not be solved.'}</p>;
  return (
    <p className="text-ink-soft dark:text-night-ink-soft">
      At <Quantity value={figures.cmrrFrequencyHz} unit="Hz" />, worst case: CMRR <Quantity value={figures.cmrrAtFrequencyDb} unit="dB" /> single-ended (tail-limited)
      {figures.cmrrDifferentialWorstCaseDb !== null && (
        <>
          , <Quantity value={figures.cmrrDifferentialWorstCaseDb} unit="dB" /> differential (mismatch-limited)
        </>
      )}
      ; tail current <Quantity value={option.predicted?.tailCurrentA} unit="A" /> nominal.
    </p>
  );
}
