import type { RecommendResult } from '#shared/engine/recommend';
import { Verdict } from '../../../../components/ui/verdict';
import { besideRecommendation, currentDesignName, currentDesignRole } from '#shared/workflow/current-design';
import type { ProposalState } from '#shared/workflow/proposal-states';
import type { ShownDesign } from '../../lib/current-design';
import { noPassingExplanation } from '../../lib/ranking-explanation';

/** The engine writes cautions as "Caution: …"; the block's heading already says so. */
function withoutCautionWord(text: string): string {
  const rest = text.replace(/^caution:\s*/i, '');
  return rest.charAt(0).toUpperCase() + rest.slice(1);
}

/** Hazard cautions in a block nobody can miss: an alert, a glyph and words, not colour alone. */
export function CautionsBlock({ cautions }: { cautions: string[] }) {
  if (cautions.length === 0) return null;
  return (
    <div role="alert" className="rounded-lg border-2 border-note bg-note-soft px-4 py-3 text-ink dark:bg-note/20 dark:text-night-ink">
      <p className="flex items-center gap-2 text-base font-semibold text-note dark:text-note-bright">
        <span aria-hidden="true" className="text-lg leading-none">
          ⚠
        </span>
        {cautions.length === 1 ? 'Caution' : `${cautions.length} cautions`} — read before using any option
      </p>
      <ul className="mt-1.5 space-y-1 text-sm">
        {cautions.map((caution) => (
          <li key={caution}>{withoutCautionWord(caution)}</li>
        ))}
      </ul>
    </div>
  );
}

/**
 * The proposal's one current design first (signed off, decided, or recommended while nobody has
 * decided), the recommendation beside it when they differ with the designer's reason, why the
 * recommendation is what it is, and the estimates notice.
 */
export function RecommendationSummary({ result, status, current }: { result: RecommendResult; status: ProposalState; current: ShownDesign | null }) {
  const beside = current ? besideRecommendation(current) : null;
  return (
    <div className="rounded-lg border border-rule bg-sheet px-4 py-3 dark:border-night-rule dark:bg-night-sheet" data-current-design={current ? current.topology : undefined}>
      <p className="flex flex-wrap items-baseline gap-x-2 gap-y-1">
        {current ? (
          <>
            <span className="text-sm text-ink-soft dark:text-night-ink-soft">{currentDesignRole(current, status)}</span>
            <span className="text-lg font-medium text-fern dark:text-fern-bright">{currentDesignName(current)}</span>
            {current.basis === 'recommendation' && <span className="text-sm">— {result.summary}</span>}
          </>
        ) : (
          <>
            <Verdict kind="short" label="No recommendation" />
            <span className="text-sm">{result.summary}</span>
          </>
        )}
      </p>
      {!current && noPassingExplanation(result) && <p className="mt-1 text-sm">{noPassingExplanation(result)}</p>}
      {current && current.basis === 'decision' && (
        <p className="mt-1 text-sm">
          {beside ?? `The recommendation, accepted as ranked. ${result.summary}`}
          {beside && result.recommended && <span className="text-ink-soft dark:text-night-ink-soft"> ({result.summary})</span>}
        </p>
      )}
      <p className="mt-1.5 flex items-start gap-1.5 text-xs text-ink-soft dark:text-night-ink-soft">
        <span aria-hidden="true" className="mt-px inline-flex h-3.5 w-3.5 shrink-0 items-center justify-center rounded-full border border-current text-[0.6rem] leading-none font-semibold">
          i
        </span>
        <span>{result.notice}</span>
      </p>
    </div>
  );
}
