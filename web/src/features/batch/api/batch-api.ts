/**
 * Batch specs: the import report the server answers (shared/import/import-report.ts), the
 * upload itself (dry run or save), and ranking one spec of the batch.
 */
import type { ImportAction, ImportReport, ImportRowReport } from '#shared/import/import-report';
import type { ImportIssue } from '#shared/import/spec-file';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { Proposal } from '#shared/api/proposals';

/** The import report (and its rows and problems) as the server answers it. */
export type { ImportAction, ImportIssue, ImportReport, ImportRowReport };

/** Sends the file; with `dryRun` the server checks every row and saves nothing. */
export function importSpecs(projectId: number, file: File, dryRun: boolean): Promise<ImportReport> {
  const form = new FormData();
  form.append('file', file, file.name);
  return apiClient.upload<ImportReport>(api.specImport(projectId, dryRun), form);
}

/** Ranks the latest version of one spec (the same route as the spec page's "Rank tail options"). */
export function rankImportedSpec(specId: number): Promise<Proposal> {
  return apiClient.post<Proposal>(api.specProposals(specId));
}
