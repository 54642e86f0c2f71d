/** Batch work on the wire: importing a file of specs and one CSV of many proposals (/api/projects/:id/...). */
export type { ImportAction, ImportReport, ImportRowReport } from '../import/import-report';

/** POST /api/projects/:id/specs/import?dryRun=true: report each row and save nothing. */
export interface ImportQuery {
  dryRun: 'true' | 'false';
}

/** GET /api/projects/:id/proposals.csv?ids=12,13,14: the ids, comma-separated (their form is checked by the route). */
export interface BatchCsvQuery {
  ids: string;
}
