/**
 * A batch's results as CSV (RFC 4180, through the ranking table's field writer, which keeps each
 * title on one line and neutralises what a spreadsheet would run as a formula): one row per
 * proposal (one per spec of an import), with the figures of the recommended option, or of the
 * first-ranked option when none passes. SI units in the headers, figures at the precision the
 * page shows, the rejection's kind beside it (single-ended or differential, outputRejection), the
 * state in the app's words; figures are estimates to confirm by simulation and bench measurement.
 */
import { outputRejection } from '../engine/output-rejection';
import type { RecommendResult } from '../engine/recommend';
import { STATE_WORDS, type ProposalState } from '../workflow/proposal-states';
import { csvField, toDecimals, toSignificant } from './ranking-csv';

/** What the table needs of one proposal. */
export interface BatchResultInput {
  specTitle: string;
  specVersion: number;
  proposalId: number;
  status: string;
  result: RecommendResult;
}

export const BATCH_CSV_HEADER = [
  'spec_title',
  'spec_version',
  'proposal_id',
  'state',
  'recommended_topology',
  'figures_of_topology',
  'passes',
  'rejection_db',
  'rejection_kind',
  'tail_current_a',
  'gain_v_per_v',
  'power_worst_w',
] as const;

/** A state as the app names it ("Awaiting review"); a state the app does not know, as stored. */
function stateWords(status: string): string {
  return STATE_WORDS[status as ProposalState] ?? status;
}
/** The option whose figures a row shows: the recommended one, else the first ranked. */
function shownOption(result: RecommendResult) {
  return result.options.find((o) => o.topology === result.recommended) ?? result.options.find((o) => o.rank === 1) ?? result.options[0];
}

/** One row per proposal, in the order given, with the header row. */
export function batchResultsCsv(items: readonly BatchResultInput[]): string {
  const rows: string[] = [BATCH_CSV_HEADER.join(',')];
  for (const item of items) {
    const option = shownOption(item.result);
    const values = [
      item.specTitle,
      item.specVersion,
      item.proposalId,
      stateWords(item.status),
      item.result.recommended ?? '',
      option?.topology,
      option?.passes,
      toDecimals(option?.rejectionDb, 1),
      option?.figures ? outputRejection(option.figures).kind : '',
      toSignificant(option?.predicted?.tailCurrentA),
      toSignificant(option?.figures?.gainPredicted),
      toSignificant(option?.figures?.powerWorstW),
    ];
    rows.push(values.map(csvField).join(','));
  }
  return `${rows.join('\r\n')}\r\n`;
}
