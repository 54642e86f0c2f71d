/**
 * The report's bench measurements: one line per measurement (file, quantity, points, who and when)
 * with its difference from the prediction (and the SPICE simulation) in words, and the reminder
 * that the predicted and simulated figures are estimates against a measurement of one board.
 */
import { comparisonSentence } from '#shared/measurements/comparison';
import type { MeasurementSummary } from '#shared/measurements/types';
import { ErrorPanel } from '../../../../components/ui/feedback';
import { topologyName } from '../../../../lib/topology-names';
import { ReportNote } from './report-section';
import { formatDateTime } from '../../../../lib/dates';

/** `items` oldest first: every measurement of the proposal (a proposal keeps at most MEASUREMENT_QUOTA.proposal.count, one page). */
export function ReportMeasurements({ items, error }: { items: readonly MeasurementSummary[] | undefined; error: unknown }) {
  if (error) return <ErrorPanel error={error} />;
  if (!items) return <p className="text-sm">Loading the measurements…</p>;
  if (items.length === 0) return <p className="text-sm">No bench measurement uploaded yet.</p>;
  return (
    <>
      <ul className="space-y-2 text-sm">
        {items.map((m) => (
          <li key={m.id}>
            <p className="font-medium">{comparisonSentence(m.comparison)}</p>
            <p className="text-xs text-ink-soft dark:text-night-ink-soft">
              {m.fileName} ({m.kind === 'cmrr' ? 'rejection' : 'gain'}, {m.pointCount} points, {m.designSource === 'decision' ? 'own values of the ' : ''}
              {topologyName(m.topology as never)}), uploaded by {m.uploadedBy.displayName} on {formatDateTime(m.uploadedAt, { seconds: true })}; sha256 {m.sha256.slice(0, 12)}…
              {m.note ? ` Note: ${m.note}` : ''}
            </p>
          </li>
        ))}
      </ul>
      <ReportNote>
        Differences are measured minus predicted (and minus simulated), at the spec frequency, both curves read linearly in log-frequency. The predicted and simulated figures are
        estimates; a bench measurement is one board under one set of conditions.
      </ReportNote>
    </>
  );
}
