/**
 * Batch specs: the import report the server answers (api/services/spec-import.service.ts), the
 * upload itself (dry run or save), and ranking one spec of the batch.
 */
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { Proposal } from '../../../lib/api-types';

/** One problem: its row (the header is row 1 in a CSV), the column or field, and what is wrong. */
export interface ImportIssue {
  row: number;
  field: string;
  message: string;
}

/** What a row does (in a dry run: would do). */
export type ImportAction = 'created' | 'new-version' | 'unchanged' | 'skipped';

export interface ImportRowReport {
  row: number;
  title: string | null;
  ok: boolean;
  errors: ImportIssue[];
  action: ImportAction;
  specId: number | null;
  version: number | null;
}

export interface ImportReport {
  fileName: string;
  format: 'csv' | 'json';
  dryRun: boolean;
  total: number;
  valid: number;
  counts: Record<ImportAction, number>;
  headerErrors: ImportIssue[];
  rows: ImportRowReport[];
}

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
