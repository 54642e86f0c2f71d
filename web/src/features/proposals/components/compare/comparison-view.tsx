import { useMemo } from 'react';
import type { TopologyId } from '#shared/engine/types';
import { formatPercent } from '#shared/units/figures';
import { PlotFigure } from '../../../../components/charts/plot-figure';
import { Sheet } from '../../../../components/ui/sheet';
import { RejectionChart } from '../ranking/plots/lazy-charts';
import { rejectionSummary } from '../../lib/plot-summaries';
import { checkRows, comparisonPlot, differenceCount, figureRows, MOVED_FRACTION, provenanceWarnings, sideLabel, type Side } from '../../lib/comparison';
import { ChecksComparison, FiguresComparison } from './comparison-tables';
import { DifferenceKey } from './difference-marks';
import { SideRecords } from './side-records';

const MOVED_PERCENT = formatPercent(MOVED_FRACTION * 100);

/** Two options side by side: the records they come from, the warnings, every figure and check, both rejection curves. */
export function ComparisonView({ a, b, onTail }: { a: Side; b: Side; onTail: (key: Side['key'], topology: TopologyId) => void }) {
  const figures = useMemo(() => figureRows(a, b), [a, b]);
  const checks = useMemo(() => checkRows(a, b), [a, b]);
  const warnings = useMemo(() => provenanceWarnings(a, b), [a, b]);
  const plotted = useMemo(() => comparisonPlot(a, b), [a, b]);
  const nameA = sideLabel(a);
  const nameB = sideLabel(b);
  const sameOption = a.proposal.id === b.proposal.id && a.option.topology === b.option.topology;
  const figuresDiffering = differenceCount(figures);
  const checksDiffering = differenceCount(checks);
  return (
    <div className="space-y-5">
      <SideRecords sides={[a, b]} onTail={onTail} />
      {warnings.length > 0 && (
        <div role="note" aria-label="Read with care" className="rounded-lg border border-note/60 bg-note-soft/50 px-4 py-3 text-sm dark:border-note-bright/40 dark:bg-note/15">
          <p className="font-medium">
            <span aria-hidden="true">▵ </span>Read with care
          </p>
          <ul className="mt-1 list-disc space-y-1 pl-5">
            {warnings.map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
        </div>
      )}
      <p className="text-sm" data-testid="difference-summary">
        {sameOption
          ? 'The same option of the same proposal is on both sides: choose another option for one of them.'
          : `${figuresDiffering === 0 ? 'No figure' : figuresDiffering === 1 ? '1 figure' : `${figuresDiffering} figures`} and ${checksDiffering === 0 ? 'no check' : checksDiffering === 1 ? '1 check' : `${checksDiffering} checks`} differ. A figure is marked when the two sides differ by more than ${MOVED_PERCENT} of the larger, a check when its verdict changes, a margin when it changes sign.`}{' '}
        <span className="text-ink-soft dark:text-night-ink-soft">{a.proposal.result.notice}</span>
      </p>
      <Sheet title="Figures" aria-label="Figures side by side">
        <FiguresComparison rows={figures} nameA={nameA} nameB={nameB} />
        <DifferenceKey movedPercent={MOVED_PERCENT} />
      </Sheet>
      <Sheet title="Checks" aria-label="Checks side by side">
        <ChecksComparison rows={checks} nameA={nameA} nameB={nameB} />
        <DifferenceKey movedPercent={MOVED_PERCENT} />
      </Sheet>
      {plotted && (
        <Sheet>
          <PlotFigure
            title="Rejection against frequency, both sides"
            summary={`${rejectionSummary(plotted.plot)} Side A solid, side B dashed; curves at nominal conditions, diamonds at each side’s worst corner at the spec frequency.${plotted.targetsDiffer ? ' The target lines are side A’s: side B is held to another target.' : ''}`}
          >
            <RejectionChart plot={plotted.plot} selected={null} />
          </PlotFigure>
        </Sheet>
      )}
    </div>
  );
}
