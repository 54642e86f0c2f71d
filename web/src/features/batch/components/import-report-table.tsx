/**
 * The import check as a table: every spec row of the file with its row number (as the
 * spreadsheet counts them: the header is row 1), whether it is valid, what saving does with it,
 * and each problem on its own line with the column it is in.
 */
import { Link } from 'react-router-dom';
import { Verdict } from '../../../components/ui/verdict';
import { paths } from '../../../config/paths';
import { DenseTable, Td, Th } from '../../../components/ui/dense-table';
import type { ImportAction, ImportReport, ImportRowReport } from '../api/batch-api';

/** What a valid row does, or (in a check) would do. */
export function actionText(row: ImportRowReport, dryRun: boolean): string {
  const words: Record<ImportAction, string> = dryRun
    ? { created: 'New spec', 'new-version': `New version${row.version ? ` (v${row.version})` : ''}`, unchanged: `Unchanged${row.version ? ` (v${row.version})` : ''}`, skipped: 'Not saved' }
    : { created: 'Created (v1)', 'new-version': `Saved as v${row.version ?? '?'}`, unchanged: `Unchanged (v${row.version ?? '?'})`, skipped: 'Skipped' };
  return words[row.action];
}

function FieldName({ field }: { field: string }) {
  return field === '' ? <span className="text-ink-soft italic dark:text-night-ink-soft">whole row</span> : <code className="text-xs">{field}</code>;
}

export function ImportReportTable({ report, showOnlyProblems = false }: { report: ImportReport; showOnlyProblems?: boolean }) {
  const rows = showOnlyProblems ? report.rows.filter((r) => !r.ok) : report.rows;
  const unit = report.format === 'csv' ? 'Row' : 'Item';
  return (
    <div className="space-y-3">
      {report.headerErrors.length > 0 && (
        <div role="note" aria-label="Header problems" className="rounded-md border border-note/40 bg-note-soft p-3 text-sm dark:bg-note/20">
          <p className="font-medium">The header (row 1) has problems:</p>
          <ul className="mt-1 list-disc pl-5">
            {report.headerErrors.map((issue) => (
              <li key={`${issue.field}:${issue.message}`}>
                <FieldName field={issue.field} /> {issue.message}
              </li>
            ))}
          </ul>
        </div>
      )}
      <DenseTable caption={`Check of ${report.fileName}: ${report.valid} of ${report.total} specs valid`}>
        <thead>
          <tr>
            <Th className="text-right">{unit}</Th>
            <Th>Title</Th>
            <Th>Status</Th>
            <Th>Field</Th>
            <Th>Problem, or what saving does</Th>
          </tr>
        </thead>
        <tbody>
          {rows.flatMap((row) => {
            const lines = row.ok ? [null] : row.errors;
            return lines.map((issue, i) => (
              <tr key={`${row.row}:${i}`} data-row={row.row} className={row.ok ? undefined : 'bg-short-soft/40 dark:bg-short/10'}>
                {i === 0 && (
                  <>
                    <Td rowSpan={lines.length} className="text-right align-top tabular-nums">
                      {row.row}
                    </Td>
                    <Td rowSpan={lines.length} className="align-top">
                      {row.specId && !report.dryRun ? (
                        <Link to={paths.spec.href(row.specId)} className="font-medium text-fern hover:underline dark:text-fern-bright">
                          {row.title}
                        </Link>
                      ) : (
                        (row.title ?? <span className="text-ink-soft italic dark:text-night-ink-soft">no title</span>)
                      )}
                    </Td>
                    <Td rowSpan={lines.length} className="align-top">
                      {row.ok ? <Verdict kind="holds" label="Valid" /> : <Verdict kind="short" label={`${row.errors.length} problem${row.errors.length === 1 ? '' : 's'}`} />}
                    </Td>
                  </>
                )}
                {issue ? (
                  <>
                    <Td>
                      <FieldName field={issue.field} />
                    </Td>
                    <Td>{issue.message}</Td>
                  </>
                ) : (
                  <>
                    <Td />
                    <Td>{actionText(row, report.dryRun)}</Td>
                  </>
                )}
              </tr>
            ));
          })}
        </tbody>
      </DenseTable>
    </div>
  );
}
