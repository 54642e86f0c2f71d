/** The check (dry run) or result of a batch import as the API returns it (`POST /api/projects/:id/specs/import`). */
import type { ImportIssue, SpecFileFormat } from './spec-file';

/** What a row does (dry run: would do): a new spec, the next version of one, nothing (same document), or nothing (the row has problems). */
export type ImportAction = 'created' | 'new-version' | 'unchanged' | 'skipped';

export interface ImportRowReport {
  row: number;
  title: string | null;
  ok: boolean;
  errors: ImportIssue[];
  action: ImportAction;
  /** The spec the row lands in (null for a new spec in a dry run, and for skipped rows). */
  specId: number | null;
  /** The spec's version after the row (for "unchanged", its latest version; null where specId is). */
  version: number | null;
}

export interface ImportReport {
  fileName: string;
  format: SpecFileFormat;
  dryRun: boolean;
  /** Spec rows in the file, valid ones, and how many rows each action took. */
  total: number;
  valid: number;
  counts: Record<ImportAction, number>;
  /** Problems of the CSV header (row 1); they are also reported on each row they touch. */
  headerErrors: ImportIssue[];
  rows: ImportRowReport[];
}
