import { formatQuantity } from '#shared/units/index';
import type { OptionEvaluation } from '#shared/api/proposals';
import { formatDb, formatMargin, formatTargetDb } from '#shared/units/figures';

/**
 * The checked option's rejection at the spec frequency at its worst corner: tail-limited, and for a
 * differential output also the mismatch worst case, each against what the spec needs and beside
 * the ranked option of the same topology.
 */
export function RejectionFigures({ option, ranked }: { option: OptionEvaluation; ranked: OptionEvaluation | null }) {
  const f = option.figures;
  if (!f) return null;
  const frequency = formatQuantity(f.cmrrFrequencyHz, 'Hz');
  const rankedF = ranked?.figures ?? null;
  return (
    <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm" aria-label="Worst-corner rejection">
      <dt className="text-ink-soft dark:text-night-ink-soft">Worst corner for rejection</dt>
      <dd>{f.worstCmrrCorner}</dd>
      <dt className="text-ink-soft dark:text-night-ink-soft">Rejection at {frequency}, tail-limited</dt>
      <dd>
        <span className="font-medium tabular-nums">{formatDb(f.cmrrAtFrequencyDb)}</span> against {formatTargetDb(f.cmrrRequiredDb)} + {formatTargetDb(f.cmrrMarginRequiredDb)} margin (
        <span className="tabular-nums">{formatMargin(f.cmrrMarginDb, 'dB')}</span>)
        {rankedF && <Ranked text={formatDb(rankedF.cmrrAtFrequencyDb)} />}
      </dd>
      {f.cmrrDifferentialWorstCaseDb !== null && (
        <>
          <dt className="text-ink-soft dark:text-night-ink-soft">Rejection at {frequency}, mismatch worst case</dt>
          <dd>
            <span className="font-medium tabular-nums">{formatDb(f.cmrrDifferentialWorstCaseDb)}</span> against {formatTargetDb(f.cmrrRequiredDb)}
            {f.cmrrDifferentialWorstCaseMarginDb !== null && <span className="tabular-nums"> ({formatMargin(f.cmrrDifferentialWorstCaseMarginDb, 'dB')})</span>}
            {rankedF?.cmrrDifferentialWorstCaseDb != null && <Ranked text={formatDb(rankedF.cmrrDifferentialWorstCaseDb)} />}
          </dd>
        </>
      )}
    </dl>
  );
}

function Ranked({ text }: { text: string }) {
  return <span className="text-xs text-ink-soft dark:text-night-ink-soft"> · ranked option {text}</span>;
}
