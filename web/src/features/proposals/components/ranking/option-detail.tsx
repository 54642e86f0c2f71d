import type { ReactNode } from 'react';
import type { RecommendOption } from '#shared/engine/recommend';
import type { ResistorSeries } from '#shared/engine/types';
import { EmptyState } from '../../../../components/ui/feedback';
import { OptionVerdict } from '../../../../components/ui/verdict';
import { blockingShortCount } from '../../lib/option-rows';
import { topologyName } from '../../../../lib/topology-names';
import { ChecksTable } from './checks-table';
import { CornersTable } from './corners-table';
import { OptionNotes } from './option-notes';
import { OptionPlots } from './plots/option-plots';
import { OptionSchematic } from './schematic/option-schematic';
import { RejectionLimits } from './rejection-limits';
import { SizedValues } from './sized-values';

function Part({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="border-t border-rule pt-4 dark:border-night-rule">
      <h3 className="mb-2 text-sm font-medium">{title}</h3>
      {children}
    </section>
  );
}

/** Everything about the selected option: values, schematic, checks, plots, corners, notes. */
export function OptionDetail({
  option,
  recommended,
  series,
  tolerancePercent,
  card = null,
}: {
  option: RecommendOption;
  recommended: boolean;
  series: ResistorSeries | null;
  tolerancePercent: number | null;
  /** The library card the spec was filled from, and what the engine leaves out of it. */
  card?: { name: string; notes: string[] } | null;
}) {
  const name = topologyName(option.topology);
  const short = blockingShortCount(option);
  return (
    <section id="option-detail" aria-labelledby="option-detail-title" className="space-y-5 rounded-lg border border-rule bg-sheet p-4 dark:border-night-rule dark:bg-night-sheet">
      <header className="flex flex-wrap items-center gap-x-3 gap-y-1">
        <h2 id="option-detail-title" className="text-lg font-medium">
          {name}
        </h2>
        <span className="text-sm text-ink-soft dark:text-night-ink-soft">rank {option.rank}</span>
        <OptionVerdict option={{ passes: option.passes, blockingShortCount: short }} form="sentence" />
        {recommended && <span className="text-sm text-fern dark:text-fern-bright">◆ the recommendation</span>}
      </header>
      {option.design ? (
        <div className="grid gap-6 lg:grid-cols-[minmax(0,11fr)_minmax(0,9fr)]">
          <figure className="min-w-0">
            <OptionSchematic design={option.design} className="mx-auto w-full max-w-[560px]" />
            <figcaption className="mt-1 text-center text-xs text-ink-soft dark:text-night-ink-soft">The stage as sized; the tail element in the accent colour.</figcaption>
          </figure>
          <SizedValues design={option.design} series={series} tolerancePercent={tolerancePercent} facts={option.figures} predicted={option.predicted} />
        </div>
      ) : (
        <EmptyState title="This option could not be sized">{option.error}</EmptyState>
      )}
      <Part title="Checks">
        <ChecksTable checks={option.checks} topology={option.topology} />
      </Part>
      {option.rejectionLimits && option.rejectionLimits.limits.length > 0 && (
        <Part title="What limits the rejection at the spec frequency">
          <RejectionLimits option={option} />
        </Part>
      )}
      <Part title="Over mismatch and temperature">
        <OptionPlots option={option} />
      </Part>
      {option.corners.length > 0 && (
        <Part title="At the corners of the spec">
          <CornersTable option={option} />
        </Part>
      )}
      <Part title="Notes">
        <OptionNotes option={option} card={card} />
      </Part>
    </section>
  );
}
