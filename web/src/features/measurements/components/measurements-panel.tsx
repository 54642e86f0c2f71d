/**
 * Bench measurements of the decided design: for designers and reviewers an upload of a CSV of
 * rejection (or gain) against frequency, refused files (and full quotas) listing each problem;
 * the measurements listed a page at a time (metadata and comparison); the chosen one's points
 * fetched on demand and plotted over the engine's predicted curve (and
 * ngspice's, once a SPICE check finished) with the spec frequency marked, and the difference
 * there stated in words and numbers. Both sides stay estimates against one bench measurement.
 */
import { useQuery } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { comparisonSentence, measurementReference } from '#shared/measurements/comparison';
import { MEASUREMENT_QUOTA, type MeasurementSummary, type MeasurementView } from '#shared/measurements/types';
import type { ProposalVerificationResult } from '#shared/verification/types';
import { formatDb } from '#shared/units/figures';
import { mayAs } from '#shared/workflow/roles';
import { FileUploadButton, UploadProblems } from '../../../components/forms/file-upload';
import { EmptyState, ErrorPanel, Loading } from '../../../components/ui/feedback';
import { Sheet } from '../../../components/ui/sheet';
import { api } from '../../../config/paths';
import type { Proposal } from '#shared/api/proposals';
import type { User } from '#shared/api/users';
import { topologyName } from '../../../lib/topology-names';
import { DenseTable, Td, Th, Tr } from '../../../components/ui/dense-table';
import { Pagination } from '../../../components/ui/pagination';
import { When } from '../../../components/ui/when';
import { verificationQuery } from '../../../lib/verification-queries';
import { PlotFigure } from '../../../components/charts/plot-figure';
import { MEASUREMENT_PAGE_SIZE, measurementQuery, measurementsQuery, useUploadMeasurement } from '../api/measurement-queries';
import { measurementPlot } from '../lib/measurement-plot';
import { MeasurementChart } from './plots/lazy-measurement-chart';

/** File types offered by the picker; the server decides by content, not by name. */
const ACCEPT = '.csv,.txt,.tsv,text/csv,text/plain';
const MEASURABLE = ['decided', 'returned', 'approved'];

const QUOTA = MEASUREMENT_QUOTA.proposal;

export function MeasurementsPanel({ proposal, user }: { proposal: Proposal; user: User }) {
  const [page, setPage] = useState(1);
  const measurements = useQuery(measurementsQuery(proposal.id, page));
  const upload = useUploadMeasurement(proposal.id);
  const decided = MEASURABLE.includes(proposal.status) && proposal.decisions.length > 0;
  const canUpload = mayAs(user, proposal.projectId, 'measurements:write') && decided;
  const noteId = useId();
  const [note, setNote] = useState('');
  const [chosenId, setChosenId] = useState<number | null>(null);

  const onFile = (file: File) => {
    upload.mutate(
      { file, note },
      {
        onSuccess: (stored) => {
          setChosenId(stored.id);
          setPage(1);
          setNote('');
        },
      },
    );
  };

  const items = measurements.data?.items ?? [];
  const total = measurements.data?.total ?? 0;
  // The chosen measurement, else the newest on the page (the list is newest first).
  const chosen = items.find((m) => m.id === chosenId) ?? (chosenId === null ? (items[0] ?? null) : null);
  const shownId = chosen?.id ?? chosenId;

  return (
    <Sheet title="Bench measurements" aria-label="Bench measurements">
      <div className="space-y-4">
        <p className="text-sm text-ink-soft dark:text-night-ink-soft">
          Measured rejection or gain of the built design, set over the engine’s prediction{' '}
          {proposal.specVersion.payload.gain?.output === 'differential' ? '(single-ended, one collector against ground, as the SPICE check compares it)' : ''} and, once a
          SPICE check has finished, ngspice’s curve. The predicted and simulated figures are estimates; one board on one bench is one sample, not the design’s spread.
        </p>
        {!decided ? (
          <EmptyState title="Nothing decided yet">Measurements belong to a decided design: they can be uploaded once a designer has decided on this proposal.</EmptyState>
        ) : (
          canUpload && (
            <div className="flex flex-wrap items-end gap-3">
              <div className="min-w-56 grow">
                <label htmlFor={noteId} className="mb-1 block text-xs font-medium">
                  Note for the next upload (optional)
                </label>
                <input
                  id={noteId}
                  type="text"
                  maxLength={1000}
                  value={note}
                  onChange={(event) => setNote(event.target.value)}
                  placeholder="Board, temperature, common-mode level…"
                  className="w-full rounded-md border border-rule bg-sheet px-2 py-1.5 text-sm dark:border-night-rule dark:bg-night-sheet"
                />
              </div>
              <FileUploadButton label="Upload a measurement (CSV)" accept={ACCEPT} pending={upload.isPending} onFile={onFile} />
              <p className="basis-full text-xs text-ink-soft dark:text-night-ink-soft">
                A header naming the quantity and unit (<code>frequency_hz,cmrr_db</code>, <code>frequency_hz,gain_db</code> or <code>frequency_hz,gain_v_per_v</code>), one point
                per line with frequencies rising, <code>#</code> for comments; 1k or 2.5 kHz are read; at most 10,000 points and 256 KB a file. A proposal keeps up to{' '}
                {QUOTA.count} measurements ({QUOTA.points.toLocaleString('en-GB')} points, {QUOTA.bytes / (1024 * 1024)} MB in all){total > 0 ? `; ${total} stored` : ''}.
              </p>
            </div>
          )
        )}
        {upload.error && <UploadProblems error={upload.error} />}
        {measurements.isPending ? (
          <Loading what="Loading the measurements" />
        ) : measurements.isError ? (
          <ErrorPanel error={measurements.error} retry={() => void measurements.refetch()} />
        ) : total === 0 ? (
          decided && (
            <EmptyState title="No measurements yet">
              {canUpload ? 'Upload a CSV of measured rejection or gain against frequency.' : 'Designers and reviewers upload bench measurements here.'}
            </EmptyState>
          )
        ) : (
          <>
            {shownId !== null && <MeasurementDetail proposal={proposal} measurementId={shownId} />}
            <MeasurementTable proposal={proposal} items={items} chosenId={shownId} onChoose={setChosenId} />
            {total > MEASUREMENT_PAGE_SIZE && <Pagination page={page} pageSize={MEASUREMENT_PAGE_SIZE} total={total} onPage={setPage} label="Measurement pages" />}
          </>
        )}
      </div>
    </Sheet>
  );
}

const isProposalResult = (result: unknown): result is ProposalVerificationResult => result !== null && typeof result === 'object' && 'options' in result;

/** The chosen measurement: its points are fetched when it is first shown. */
function MeasurementDetail({ proposal, measurementId }: { proposal: Proposal; measurementId: number }) {
  const measurement = useQuery(measurementQuery(proposal.id, measurementId));
  if (measurement.isPending) return <Loading what="Loading the measured points" />;
  if (measurement.isError) return <ErrorPanel error={measurement.error} retry={() => void measurement.refetch()} />;
  return <MeasurementPlotted proposal={proposal} measurement={measurement.data} />;
}

function MeasurementPlotted({ proposal, measurement }: { proposal: Proposal; measurement: MeasurementView }) {
  const status = useQuery(verificationQuery(proposal.id));
  const job = status.data?.verification ?? null;
  const verification = job?.state === 'finished' && isProposalResult(job.result) ? job.result : null;
  const decision = proposal.decisions.find((d) => d.id === measurement.decisionId) ?? null;
  const reference = measurementReference({
    options: proposal.result.options,
    decision: decision ? { kind: decision.kind, topology: decision.topology, evaluation: decision.evaluation } : null,
    output: proposal.specVersion.payload.gain?.output === 'single-ended' ? 'single-ended' : 'differential',
    verification,
  });
  const plot = measurementPlot(measurement, reference);
  const comparison = measurement.comparison;
  const sentence = comparisonSentence(comparison);
  const design = `${topologyName(measurement.topology as never)}${measurement.designSource === 'decision' ? ', the designer’s own values' : ''}`;
  return (
    <div className="space-y-2">
      <p className="text-base font-medium" data-testid="measurement-difference">
        {sentence}
      </p>
      <p className="text-xs text-ink-soft dark:text-night-ink-soft">
        {measurement.fileName}: {measurement.pointCount} points of {measurement.kind === 'cmrr' ? 'rejection' : 'gain'} measured on the {design}.
        {measurement.note ? ` Note: ${measurement.note}${/[.!?]$/.test(measurement.note) ? '' : '.'}` : ''} Predicted and simulated figures are estimates to weigh against this measurement, not to replace it.
      </p>
      <PlotFigure
        title={measurement.kind === 'cmrr' ? 'Measured rejection over the estimates' : 'Measured gain over the prediction'}
        summary={`${sentence} Log-frequency axis; the ${measurement.kind === 'cmrr' ? 'spec frequency' : 'compared frequency'} is marked.`}
      >
        <MeasurementChart plot={plot} atFrequencyHz={comparison.atFrequencyHz} measuredAtDb={comparison.measuredDb} />
      </PlotFigure>
    </div>
  );
}

function MeasurementTable({ proposal, items, chosenId, onChoose }: { proposal: Proposal; items: MeasurementSummary[]; chosenId: number | null; onChoose: (id: number) => void }) {
  return (
    <DenseTable caption="Bench measurements of this proposal">
      <thead>
        <tr>
          <Th>File</Th>
          <Th>Quantity</Th>
          <Th className="text-right">Points</Th>
          <Th className="text-right">Measured − predicted</Th>
          <Th>Uploaded</Th>
          <Th>
            <span className="sr-only">Actions</span>
          </Th>
        </tr>
      </thead>
      <tbody>
        {items.map((m) => (
          <Tr key={m.id}>
            <Td className="align-top">
              <span title={`sha256 ${m.sha256}`} className={m.id === chosenId ? 'font-medium' : undefined}>
                {m.fileName}
              </span>
              {m.note && <span className="block max-w-xs truncate text-xs text-ink-soft dark:text-night-ink-soft">{m.note}</span>}
            </Td>
            <Td className="align-top">{m.kind === 'cmrr' ? 'Rejection (dB)' : `Gain (${m.unit})`}</Td>
            <Td className="text-right align-top tabular-nums">{m.pointCount}</Td>
            <Td className="text-right align-top tabular-nums">{differenceText(m)}</Td>
            <Td className="align-top text-ink-soft dark:text-night-ink-soft">
              {m.uploadedBy.displayName}, <When iso={m.uploadedAt} />
            </Td>
            <Td className="space-x-3 align-top whitespace-nowrap">
              <button type="button" className="text-fern hover:underline disabled:text-ink-soft dark:text-fern-bright" disabled={m.id === chosenId} onClick={() => onChoose(m.id)}>
                {m.id === chosenId ? 'Shown' : 'Show'}
                <span className="sr-only"> {m.fileName}</span>
              </button>
              <a className="text-fern hover:underline dark:text-fern-bright" href={api.measurementFile(proposal.id, m.id)} download>
                CSV<span className="sr-only"> of {m.fileName}</span>
              </a>
            </Td>
          </Tr>
        ))}
      </tbody>
    </DenseTable>
  );
}

function differenceText(m: MeasurementSummary): string {
  const d = m.comparison.differenceFromPredictedDb;
  if (d === null) return '—';
  return formatDb(d, { sign: 'exceptZero' });
}
