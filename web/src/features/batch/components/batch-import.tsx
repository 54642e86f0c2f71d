/**
 * The batch flow on one page: choose a file, see the server's check of every row (nothing saved
 * yet), save the valid specs, rank them one after another with a progress bar, download the
 * batch's results as CSV.
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { Sheet } from '../../../components/ui/sheet';
import { api, paths } from '../../../config/paths';
import { ApiError } from '../../../lib/api';
import type { Proposal } from '#shared/api/proposals';
import { topologyName } from '../../../lib/topology-names';
import { DenseTable, Td, Th } from '../../../components/ui/dense-table';
import { importSpecs, rankImportedSpec, type ImportReport } from '../api/batch-api';
import { rankInTurn, type RankItem, type RankOutcome, type RankProgress } from '../lib/rank-in-turn';
import { ImportReportTable } from './import-report-table';
import { projectKeys, specKeys, waitingKeys } from '../../../lib/query-keys';

const MAX_FILE_BYTES = 1024 * 1024;

function errorText(error: unknown): string {
  if (error instanceof ApiError) {
    // The form field a detail is about, without its pointer slash: "file is not UTF-8 text…".
    const detail = error.details.map((d) => `${d.path ? `${d.path.replace(/^\//, '')} ` : ''}${d.message}`).join('; ');
    return detail ? `${error.message} ${detail}` : error.message;
  }
  return error instanceof Error ? error.message : 'Something went wrong.';
}

function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}

/** "2 new specs and 1 new version", leaving out a kind with none; "nothing" when both are none. */
function writesText(counts: ImportReport['counts']): string {
  const parts = [counts.created > 0 ? plural(counts.created, 'new spec') : '', counts['new-version'] > 0 ? plural(counts['new-version'], 'new version') : ''].filter(Boolean);
  return parts.length > 0 ? parts.join(' and ') : 'nothing';
}

/** What saving the checked file would write: new specs and new versions (unchanged rows write nothing). */
const toWrite = (report: ImportReport) => report.counts.created + report.counts['new-version'];

/** After the server's per-person proposal limit (429), ask again in 10 s; anything else is a failure of that spec. */
const TOO_MANY_WAIT_MS = 10_000;
const waitWhenTooMany = (error: unknown) => (error instanceof ApiError && error.status === 429 ? TOO_MANY_WAIT_MS : null);

export function BatchImport({ projectId, canRank }: { projectId: number; canRank: boolean }) {
  const queryClient = useQueryClient();
  const fileInput = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [fileProblem, setFileProblem] = useState<string | null>(null);
  const [onlyProblems, setOnlyProblems] = useState(false);

  const check = useMutation({ mutationFn: (chosen: File) => importSpecs(projectId, chosen, true) });
  const save = useMutation({
    mutationFn: (chosen: File) => importSpecs(projectId, chosen, false),
    onSuccess: async () => {
      await Promise.all([queryClient.invalidateQueries({ queryKey: projectKeys.specs(projectId) }), queryClient.invalidateQueries({ queryKey: specKeys.all }), queryClient.invalidateQueries({ queryKey: waitingKeys.all })]);
    },
  });

  const choose = (chosen: File | undefined) => {
    check.reset();
    save.reset();
    setFile(chosen ?? null);
    setFileProblem(null);
    if (!chosen) return;
    if (chosen.size > MAX_FILE_BYTES) {
      setFileProblem(`${chosen.name} is ${(chosen.size / 1024 / 1024).toFixed(1)} MB; a file may be at most 1 MB. Split it into smaller files.`);
      return;
    }
    check.mutate(chosen);
  };

  const startOver = () => {
    check.reset();
    save.reset();
    setFile(null);
    setFileProblem(null);
    if (fileInput.current) fileInput.current.value = '';
  };

  const checked = check.data;
  const saved = save.data;

  return (
    <div className="space-y-6">
      <Sheet title="1. Choose a file" aria-label="Choose a file">
        <div className="space-y-3 text-sm">
          <p>
            A CSV with one spec per row under a header naming the columns, or JSON: an array of specs, or <code className="text-xs">{'{ "specs": [ … ] }'}</code>. Quantities in SI units, or as you write them: 4k7, 10u, −12 V, 2 pF. Empty cells take the defaults. Nothing is saved until you have seen the check.
          </p>
          <p>
            <a href={api.specCsvTemplate} download className="font-medium text-fern hover:underline dark:text-fern-bright">
              Download the CSV template
            </a>{' '}
            <span className="text-ink-soft dark:text-night-ink-soft">(every column, with one example row)</span>
          </p>
          <p className="text-ink-soft dark:text-night-ink-soft">
            Importing the same file again changes nothing: a spec whose title is already in the project and whose figures are the same is left unchanged; with other figures it gets a new version.
          </p>
          <div className="flex flex-wrap items-center gap-3">
            <label htmlFor="batch-file" className="font-medium">
              Spec file (CSV or JSON, up to 1 MB)
            </label>
            <input
              id="batch-file"
              ref={fileInput}
              type="file"
              accept=".csv,.json,.tsv,.txt,text/csv,application/json"
              onChange={(event) => choose(event.target.files?.[0])}
              disabled={check.isPending || save.isPending}
              className="text-sm file:mr-3 file:rounded-md file:border file:border-rule file:bg-sheet file:px-3 file:py-1.5 file:text-sm dark:file:border-night-rule dark:file:bg-night-sheet"
            />
          </div>
          {fileProblem && (
            <p role="alert" className="text-short dark:text-short-bright">
              {fileProblem}
            </p>
          )}
          {check.isPending && (
            <p role="status" aria-live="polite" className="text-ink-soft dark:text-night-ink-soft">
              Checking every row of {file?.name}…
            </p>
          )}
          {check.isError && (
            <p role="alert" className="text-short dark:text-short-bright">
              <span aria-hidden="true">✕ </span>
              {errorText(check.error)}
            </p>
          )}
        </div>
      </Sheet>

      {checked && !saved && file && (
        <Sheet
          title="2. Check"
          aria-label="Check"
          actions={
            <label className="flex items-center gap-2 text-sm">
              <input type="checkbox" checked={onlyProblems} onChange={(e) => setOnlyProblems(e.target.checked)} />
              Only rows with problems
            </label>
          }
        >
          <p className="mb-3 text-sm" role="status">
            {plural(checked.total, 'spec')} in {checked.fileName}: {checked.valid} valid, {checked.total - checked.valid} with problems. Saving writes {writesText(checked.counts)}
            {checked.counts.unchanged > 0 ? `; ${plural(checked.counts.unchanged, 'spec')} ${checked.counts.unchanged === 1 ? 'is' : 'are'} unchanged` : ''}
            {checked.total > checked.valid ? '; rows with problems are skipped' : ''}.
          </p>
          <ImportReportTable report={checked} showOnlyProblems={onlyProblems} />
          <div className="mt-4 flex flex-wrap items-center gap-3">
            <Button onClick={() => save.mutate(file)} disabled={save.isPending || toWrite(checked) === 0}>
              {save.isPending ? 'Saving…' : toWrite(checked) === 0 ? 'Nothing to save' : `Save ${plural(toWrite(checked), 'valid spec')}`}
            </Button>
            <Button variant="secondary" onClick={startOver} disabled={save.isPending}>
              Choose another file
            </Button>
            {save.isError && (
              <p role="alert" className="text-sm text-short dark:text-short-bright">
                <span aria-hidden="true">✕ </span>
                Nothing was saved. {errorText(save.error)}
              </p>
            )}
          </div>
        </Sheet>
      )}

      {checked && !saved && file && toWrite(checked) === 0 && checked.counts.unchanged > 0 && (
        <>
          <p className="rounded-md border border-rule bg-paper px-4 py-3 text-sm dark:border-night-rule dark:bg-night" role="note">
            This file was imported before: {checked.counts.unchanged === 1 ? 'its valid spec is' : `all ${checked.counts.unchanged} valid specs are`} already in the project with the same figures, so
            there is nothing to save. Rank {checked.counts.unchanged === 1 ? 'it' : 'them'} as {checked.counts.unchanged === 1 ? 'it stands' : 'they stand'} below.
          </p>
          <RankBatch projectId={projectId} report={checked} canRank={canRank} alreadyImported />
        </>
      )}

      {saved && (
        <>
          <Sheet title="2. Saved" aria-label="Saved">
            <p className="mb-3 text-sm" role="status">
              Saved in one go: {writesText(saved.counts)}
              {saved.counts.unchanged > 0 ? `; ${saved.counts.unchanged} unchanged` : ''}
              {saved.counts.skipped > 0 ? `; ${saved.counts.skipped} skipped (rows with problems)` : ''}.
            </p>
            <ImportReportTable report={saved} />
            <div className="mt-4">
              <Button variant="secondary" onClick={startOver}>
                Import another file
              </Button>
            </div>
          </Sheet>
          <RankBatch projectId={projectId} report={saved} canRank={canRank} />
        </>
      )}
    </div>
  );
}

/** "Rank all imported specs", one after another with a progress bar, then the batch CSV. */
function RankBatch({ projectId, report, canRank, alreadyImported = false }: { projectId: number; report: ImportReport; canRank: boolean; alreadyImported?: boolean }) {
  const queryClient = useQueryClient();
  // A file imported before holds only unchanged specs: those are the ones to rank.
  const [includeUnchanged, setIncludeUnchanged] = useState(alreadyImported);
  const [progress, setProgress] = useState<RankProgress | null>(null);
  const [outcomes, setOutcomes] = useState<RankOutcome<Proposal>[] | null>(null);
  const stop = useRef(false);

  const landed = report.rows.filter((r) => r.ok && r.specId !== null);
  const items: RankItem[] = landed
    .filter((r) => r.action !== 'unchanged' || includeUnchanged)
    .map((r) => ({ specId: r.specId!, title: r.title ?? `Spec ${r.specId}` }));
  const unchanged = landed.filter((r) => r.action === 'unchanged').length;
  const running = progress !== null && progress.current !== null;
  // Specs without a proposal from this page yet: all of them at first; after a run, those that failed or were not reached.
  const remaining = items.filter((item) => !outcomes?.some((o) => o.item.specId === item.specId && o.proposal));

  const start = async (list: RankItem[]) => {
    stop.current = false;
    const results = await rankInTurn(list, rankImportedSpec, { onProgress: setProgress, shouldStop: () => stop.current, waitBefore: waitWhenTooMany });
    setOutcomes((before) => {
      const kept = (before ?? []).filter((o) => !results.some((r) => r.item.specId === o.item.specId));
      return [...kept, ...results];
    });
    await Promise.all([queryClient.invalidateQueries({ queryKey: projectKeys.detail(projectId) }), queryClient.invalidateQueries({ queryKey: waitingKeys.all })]);
  };

  if (!canRank) {
    return (
      <Sheet title="3. Rank" aria-label="Rank">
        <p className="text-sm">Your role does not ask for proposals; a systems engineer or a designer can rank these specs from their pages.</p>
      </Sheet>
    );
  }

  const ranked = (outcomes ?? []).filter((o) => o.proposal);
  return (
    <Sheet title="3. Rank" aria-label="Rank">
      {items.length === 0 && !outcomes ? (
        <p className="text-sm">Nothing new to rank{unchanged > 0 ? ' (every valid spec was unchanged)' : ''}.</p>
      ) : (
        <p className="text-sm">
          Sizes every tail option of each spec, checks it against the rules and runs its Monte Carlo, one spec after another: usually well under a second per spec here, longer when the server is busy.
        </p>
      )}
      {unchanged > 0 && !running && !alreadyImported && (
        <label className="mt-2 flex items-center gap-2 text-sm">
          <input type="checkbox" checked={includeUnchanged} onChange={(e) => setIncludeUnchanged(e.target.checked)} />
          Also rank the {plural(unchanged, 'unchanged spec')}
        </label>
      )}
      <div className="mt-3 flex flex-wrap items-center gap-3">
        {!running && remaining.length > 0 && (
          <Button onClick={() => void start(remaining)}>{outcomes ? `Rank the ${plural(remaining.length, 'spec')} not ranked yet` : `Rank all ${plural(remaining.length, 'imported spec')}`}</Button>
        )}
        {running && (
          <Button variant="secondary" onClick={() => (stop.current = true)}>
            Stop after this spec
          </Button>
        )}
      </div>
      {progress && (
        <div className="mt-4 space-y-1">
          <progress
            aria-label="Ranking progress"
            aria-valuetext={`${progress.done} of ${progress.total} ranked`}
            max={progress.total}
            value={progress.done}
            className="block h-2 w-full appearance-none overflow-hidden rounded-full bg-paper dark:bg-night [&::-moz-progress-bar]:bg-fern [&::-webkit-progress-bar]:bg-paper [&::-webkit-progress-value]:bg-fern dark:[&::-moz-progress-bar]:bg-fern-soft dark:[&::-webkit-progress-bar]:bg-night dark:[&::-webkit-progress-value]:bg-fern-soft"
          />
          <p role="status" aria-live="polite" className="text-sm">
            {progress.current ? (
              <>
                Ranking {progress.done + 1} of {progress.total}: <span className="font-medium">{progress.current.title}</span>
                {progress.waitingS !== undefined && ` — waiting ${progress.waitingS} s: the server takes at most a set number of proposals a minute from one person`}
              </>
            ) : (
              `Ranked ${ranked.length} of ${progress.total}${progress.done < progress.total ? ' (stopped)' : ''}.`
            )}
          </p>
        </div>
      )}
      {outcomes && (
        <div className="mt-4 space-y-3">
          <DenseTable caption="Proposals of the imported specs">
            <thead>
              <tr>
                <Th>Spec</Th>
                <Th>Proposal</Th>
                <Th>Recommended tail</Th>
              </tr>
            </thead>
            <tbody>
              {outcomes.map(({ item, proposal, error }) => (
                <tr key={item.specId}>
                  <Td>{item.title}</Td>
                  <Td>
                    {proposal ? (
                      <Link to={paths.proposal.href(proposal.id)} className="font-medium text-fern hover:underline dark:text-fern-bright">
                        #{proposal.id}
                      </Link>
                    ) : (
                      <span role="alert" className="text-short dark:text-short-bright">
                        <span aria-hidden="true">✕ </span>
                        {error}
                      </span>
                    )}
                  </Td>
                  <Td>{proposal ? (proposal.recommendedTopology ? topologyName(proposal.recommendedTopology) : 'No option passes') : ''}</Td>
                </tr>
              ))}
            </tbody>
          </DenseTable>
          {ranked.length > 0 && (
            <p className="text-sm">
              <a href={api.batchResultsCsv(projectId, ranked.map((o) => o.proposal!.id))} download className="font-medium text-fern hover:underline dark:text-fern-bright">
                Download the batch results (CSV)
              </a>{' '}
              <span className="text-ink-soft dark:text-night-ink-soft">
                one row per spec: version, proposal, state, recommended tail, whether it passes, rejection, tail current, gain and power.
              </span>
            </p>
          )}
          <p className="text-xs text-ink-soft dark:text-night-ink-soft">These figures are engineering estimates; confirm them by SPICE simulation and bench measurement before committing a design.</p>
        </div>
      )}
    </Sheet>
  );
}
