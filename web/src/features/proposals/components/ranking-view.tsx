import { useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { recordedDeviceQuery } from '../../../lib/device-library';
import type { TopologyId } from '#shared/engine/types';
import { AfterFirstPaint } from '../../../components/ui/deferred';
import { EmptyState } from '../../../components/ui/feedback';
import { Sheet } from '../../../components/ui/sheet';
import { api } from '../../../config/paths';
import type { Proposal } from '#shared/api/proposals';
import { optionRows, specTargets } from '../lib/option-rows';
import { rankingExplanation } from '../lib/ranking-explanation';
import { OptionDetail } from './ranking/option-detail';
import { OptionsTable } from './ranking/options-table';
import { RejectionFigure } from './ranking/plots/rejection-figure';
import { CautionsBlock, RecommendationSummary } from './ranking/preamble';
import { proposalCurrentDesign } from '../lib/current-design';
import { topologyName } from '../../../lib/topology-names';
import { TradeoffPanel } from './tradeoff/tradeoff-panel';
import { ComparePicker } from './compare/compare-picker';

const downloadLink = 'rounded-md border border-rule px-2.5 py-1 text-sm hover:bg-paper dark:border-night-rule dark:hover:bg-night';

/**
 * The ranked options: cautions and notice, the table (with its downloads), the selected option's detail, the plots.
 * With `detailAfterFirstPaint` (the proposal page) the detail mounts a frame after the table, so the table paints first.
 * `withTradeoffs` (the proposal page by default): the selected option's trade-off view below its detail (it asks the server for a sweep).
 * `withCompare` (the proposal page by default): the ways into the side-by-side view, under the table (it asks for the project's proposals).
 */
export function RankingView({
  proposal,
  detailAfterFirstPaint = false,
  withTradeoffs = detailAfterFirstPaint,
  withCompare = detailAfterFirstPaint,
}: {
  proposal: Proposal;
  detailAfterFirstPaint?: boolean;
  withTradeoffs?: boolean;
  withCompare?: boolean;
}) {
  const result = proposal.result;
  const rows = useMemo(() => optionRows(result), [result]);
  const targets = useMemo(() => specTargets(result), [result]);
  const current = useMemo(() => proposalCurrentDesign(proposal), [proposal]);
  const rankedCurrent = current && !current.ownValues ? (current.topology as TopologyId) : null;
  const [chosen, setChosen] = useState<TopologyId | null>(null);
  // The table opens on the current design (the decided or recommended option), so nobody reads another one by mistake.
  const selected = chosen ?? rankedCurrent ?? result.recommended ?? result.options[0]?.topology ?? null;
  const decidedWord = proposal.status === 'approved' ? 'signed off' : 'decided';
  const option = result.options.find((o) => o.topology === selected) ?? null;
  const resistors = proposal.specVersion.payload?.resistors;
  const explanation = useMemo(() => rankingExplanation(result), [result]);
  const card = useRecordedCard(proposal);
  return (
    <div className="space-y-4">
      <CautionsBlock cautions={result.cautions} />
      <RecommendationSummary result={result} status={proposal.status} current={current} />
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
            {current?.basis === 'decision' && (
              <a href={api.decidedNetlist(proposal.id)} download className={downloadLink} data-netlist="decided">
                {proposal.status === 'approved' ? 'Signed-off' : 'Decided'} design as SPICE netlist{current.ownValues ? ' (own values)' : ''}
              </a>
            )}
            {selected && (current?.basis !== 'decision' || current.ownValues || selected !== current.topology) && (
              <a href={api.netlist(proposal.id, selected)} download className={downloadLink} data-netlist="selected">
                {topologyName(selected)} as SPICE netlist
              </a>
            )}
          </>
        }
      >
        {current?.basis === 'decision' && current.ownValues && (
          <p className="mb-2 rounded-md border border-fern/40 bg-fern-soft/40 px-3 py-2 text-sm dark:border-fern-soft/30 dark:bg-night">
            The {proposal.status === 'approved' ? 'signed-off' : 'decided'} design is the designer’s own values ({topologyName(current.topology)}), not a ranked option: its figures and checks are in the decision below, and its netlist is
            the “{proposal.status === 'approved' ? 'Signed-off' : 'Decided'} design” download.
          </p>
        )}
        {rows.length === 0 ? (
          <EmptyState title="No options">The spec lists no tail topologies.</EmptyState>
        ) : (
          <OptionsTable rows={rows} targets={targets} selected={selected} onSelect={setChosen} current={rankedCurrent && current?.basis === 'decision' ? { topology: rankedCurrent, word: decidedWord } : null} />
        )}
        {explanation && <p className="mt-3 border-t border-rule/60 pt-2 text-sm text-ink-soft dark:border-night-rule/60 dark:text-night-ink-soft">{explanation}</p>}
      </Sheet>
      {withCompare && rows.length > 0 && (
        <AfterFirstPaint skip={!detailAfterFirstPaint}>
          <ComparePicker proposal={proposal} selected={selected} />
        </AfterFirstPaint>
      )}
      {rows.length > 0 && (
        <Sheet>
          <RejectionFigure result={result} selected={selected} />
        </Sheet>
      )}
      {option && (
        <AfterFirstPaint skip={!detailAfterFirstPaint}>
          <OptionDetail
            option={option}
            recommended={option.topology === result.recommended}
            series={resistors?.series ?? null}
            tolerancePercent={resistors?.tolerancePercent ?? null}
            card={card}
          />
          {withTradeoffs && <TradeoffPanel proposal={proposal} option={option} />}
        </AfterFirstPaint>
      )}
    </div>
  );
}

/** The library card the spec was filled from, with what the engine leaves out of it (null when the spec names none or it is not found). */
function useRecordedCard(proposal: Proposal): { name: string; notes: string[] } | null {
  const reference = (proposal.specVersion.payload as { deviceModel?: { name?: unknown; checksum?: unknown } } | null)?.deviceModel;
  const name = typeof reference?.name === 'string' ? reference.name : '';
  const checksum = typeof reference?.checksum === 'string' ? reference.checksum : '';
  const query = useQuery({ ...recordedDeviceQuery(proposal.projectId, name, checksum), enabled: name !== '' && checksum !== '' });
  const recorded = query.data?.recorded;
  return recorded ? { name: recorded.name, notes: recorded.notes } : null;
}
