import { useMemo, useState } from 'react';
import type { TopologyId } from '../../../../../shared/engine/types';
import { EmptyState } from '../../../components/ui/feedback';
import { Sheet } from '../../../components/ui/sheet';
import { api } from '../../../config/paths';
import type { Proposal } from '../../../lib/api-types';
import { optionRows, specTargets } from '../lib/option-rows';
import { OptionDetail } from './ranking/option-detail';
import { OptionsTable } from './ranking/options-table';
import { RejectionFigure } from './ranking/plots/rejection-figure';
import { CautionsBlock, RecommendationSummary } from './ranking/preamble';

const downloadLink = 'rounded-md border border-rule px-2.5 py-1 text-sm hover:bg-paper dark:border-night-rule dark:hover:bg-night';

/** The ranked options: cautions and notice, the table (with its downloads), the selected option's detail, the plots. */
export function RankingView({ proposal }: { proposal: Proposal }) {
  const result = proposal.result;
  const rows = useMemo(() => optionRows(result), [result]);
  const targets = useMemo(() => specTargets(result), [result]);
  const [chosen, setChosen] = useState<TopologyId | null>(null);
  const selected = chosen ?? result.recommended ?? result.options[0]?.topology ?? null;
  const option = result.options.find((o) => o.topology === selected) ?? null;
  const resistors = proposal.specVersion.payload?.resistors;
  return (
    <div className="space-y-4">
      <CautionsBlock cautions={result.cautions} />
      <RecommendationSummary result={result} />
      <Sheet
        title="Tail options"
        aria-label="Tail options"
        actions={
          <>
            <a href={api.rankingCsv(proposal.id)} download className={downloadLink}>
              Table as CSV
            </a>
            <a href={api.exportJson(proposal.id)} download className={downloadLink}>
              Whole record as JSON
            </a>
            {selected && (
              <a href={api.netlist(proposal.id, selected)} download className={downloadLink}>
                Selected option as SPICE netlist
              </a>
            )}
          </>
        }
      >
        {rows.length === 0 ? <EmptyState title="No options">The spec lists no tail topologies.</EmptyState> : <OptionsTable rows={rows} targets={targets} selected={selected} onSelect={setChosen} />}
      </Sheet>
      {rows.length > 0 && (
        <Sheet>
          <RejectionFigure result={result} selected={selected} />
        </Sheet>
      )}
      {option && <OptionDetail option={option} recommended={option.topology === result.recommended} series={resistors?.series ?? null} tolerancePercent={resistors?.tolerancePercent ?? null} />}
    </div>
  );
}
