import { useId } from 'react';
import type { Design, TopologyId } from '#shared/engine/types';
import { formatQuantity } from '#shared/units/index';
import { Button } from '../../../../components/ui/button';
import type { OptionEvaluation, Proposal } from '#shared/api/proposals';
import { fieldValue, PAIR_FIELDS, tailFields, type FieldInfo, type FieldKey } from './design-fields';
import { topologyName, topologyNameInText } from '../../../../lib/topology-names';
import { FullCheckPanel } from './full-check-panel';
import { designFromDraft, draftFromDesign, fieldErrorsOf, readDraft, withTopology, type FieldReading, type OverrideDraft } from './override-draft';
import { QuantityField } from './quantity-field';
import type { FullCheck } from './use-full-check';
import { useWhatIf } from './use-what-if';
import { WhatIfPanel } from './what-if-panel';

/**
 * Own values: the pair's and the tail's resistors (and optionally another topology), typed in
 * engineering notation, and the tail's emitter-area ratios where it has them, with the server's what-if beside the ranked option of the same topology
 * and, on request, its full check over every rule and corner.
 */
export function OverrideEditor({
  proposal,
  draft,
  onDraftChange,
  serverErrors,
  fullCheck,
}: {
  proposal: Proposal;
  draft: OverrideDraft;
  onDraftChange: (draft: OverrideDraft) => void;
  /** Field messages from a refused decision, by field. */
  serverErrors: Partial<Record<FieldKey, string>>;
  /** The full check of the values in the fields, held by the form (its verdict matters when recording). */
  fullCheck: FullCheck;
}) {
  const topologyId = useId();
  const options = proposal.result.options.filter((o) => o.design);
  const ranked = options.find((o) => o.topology === draft.topology) ?? null;
  const readings = readDraft(draft);
  const whatIf = useWhatIf(designFromDraft(draft));
  const whatIfFieldErrors = fieldErrorsOf(whatIf.settling ? null : whatIf.query.error);
  const series = proposal.specVersion.payload.resistors.series;
  const setText = (key: FieldKey, text: string) => onDraftChange({ ...draft, text: { ...draft.text, [key]: text } });
  const pairDiffers = ranked?.design ? PAIR_FIELDS.some((f) => readingOf(readings.get(f.key)) !== fieldValue(ranked.design!, f.key)) : false;
  const fieldFor = (info: FieldInfo) => (
    <QuantityField
      key={info.key}
      info={info}
      text={draft.text[info.key] ?? ''}
      reading={readings.get(info.key)!}
      serverError={serverErrors[info.key] ?? fullCheck.fieldErrors[info.key] ?? whatIfFieldErrors[info.key]}
      series={series}
      ranked={ranked?.design ? fieldValue(ranked.design, info.key) : undefined}
      onChange={(text) => setText(info.key, text)}
    />
  );

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <div className="text-sm">
          <label htmlFor={topologyId} className="mb-1 block font-medium">
            Tail topology
          </label>
          <select
            id={topologyId}
            value={draft.topology}
            onChange={(e) => {
              const topology = e.target.value as TopologyId;
              onDraftChange(withTopology(draft, topology, options.find((o) => o.topology === topology)?.design ?? null));
            }}
            className="rounded-md border border-rule bg-sheet px-3 py-2 dark:border-night-rule dark:bg-night"
          >
            {options.map((o) => (
              <option key={o.topology} value={o.topology}>
                {topologyName(o.topology)}
              </option>
            ))}
          </select>
        </div>
        {ranked?.design && (
          <Button variant="secondary" onClick={() => onDraftChange(draftFromDesign(ranked.design!))}>
            Reset every value to the ranked {topologyNameInText(draft.topology)}
          </Button>
        )}
      </div>

      {pairDiffers && ranked?.design && (
        <PairHint
          ranked={{ ...ranked, design: ranked.design }}
          onUse={() => {
            const rankedText = draftFromDesign(ranked.design!).text;
            onDraftChange({ ...draft, text: { ...draft.text, ...Object.fromEntries(PAIR_FIELDS.map((f) => [f.key, rankedText[f.key]])) } });
          }}
        />
      )}

      <fieldset className="grid max-w-2xl gap-x-4 gap-y-2 sm:grid-cols-2">
        <legend className="mb-1 text-xs font-medium tracking-wide text-ink-soft uppercase dark:text-night-ink-soft">Pair</legend>
        {PAIR_FIELDS.map(fieldFor)}
      </fieldset>
      <fieldset className="grid max-w-2xl gap-x-4 gap-y-2 sm:grid-cols-2">
        <legend className="mb-1 text-xs font-medium tracking-wide text-ink-soft uppercase dark:text-night-ink-soft">Tail: {topologyName(draft.topology)}</legend>
        {tailFields(draft.topology).map(fieldFor)}
      </fieldset>
      <HeldConditions design={draft.base} />
      <WhatIfPanel proposal={proposal} whatIf={whatIf} ranked={ranked} />
      <FullCheckPanel check={fullCheck} ranked={ranked} />
    </div>
  );
}

function readingOf(reading: FieldReading | undefined): number | undefined {
  return reading?.ok ? reading.value : undefined;
}

/** The ranked option of the edited topology was sized with other pair values: say so, and offer them. */
function PairHint({ ranked, onUse }: { ranked: OptionEvaluation & { design: Design }; onUse: () => void }) {
  const values = PAIR_FIELDS.map((f) => `${f.title.toLowerCase()} ${formatQuantity(fieldValue(ranked.design, f.key) ?? 0, f.unit, 4)}`).join(' and ');
  return (
    <p className="rounded-md bg-note-soft p-2 text-xs text-note dark:bg-note/20 dark:text-note-bright">
      The ranked {topologyNameInText(ranked.topology)} was sized with {values}; your pair values differ.{' '}
      <button type="button" className="font-medium underline" onClick={onUse}>
        Use its pair values
      </button>
    </p>
  );
}

/** What the override keeps from the design it started from (the spec's device, rails and conditions). */
function HeldConditions({ design }: { design: Design }) {
  const parts = [
    `rails ${formatQuantity(design.supply.positiveV, 'V')} / ${formatQuantity(design.supply.negativeV, 'V')}`,
    `β ${design.device.beta}`,
    design.device.earlyVoltageV ? `VAF ${formatQuantity(design.device.earlyVoltageV, 'V')}` : 'no Early effect',
    `input common mode ${formatQuantity(design.inputCommonModeV ?? 0, 'V')}`,
    `${formatQuantity(design.temperatureC ?? 27, '°C')}`,
    `tail capacitance ${formatQuantity(design.tailCapacitanceF ?? 0, 'F')}`,
  ];
  return <p className="text-xs text-ink-soft dark:text-night-ink-soft">Kept from the spec: {parts.join(', ')}.</p>;
}
