/**
 * On a proposal of an older spec version: the spec has moved on to version N, with the latest
 * version's note and what changed since the ranked version (folded away until asked for).
 */
import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import type { JsonChange } from '#shared/json-diff';
import { paths } from '../../../config/paths';
import type { SchemaNode } from '../lib/schema-nodes';
import { readableChanges } from '../lib/spec-changes';
import { ChangesTable } from './changes-table';

export interface SpecMovedOnProps {
  specId: number;
  rankedVersion: number;
  rankedPayload: unknown;
  movedOn: { latestVersion: number; latestNote: string | null; latestPayload: unknown; changes: JsonChange[] };
  schema: SchemaNode;
  /** Closing words: what the reader can do about it. */
  advice: string;
}

export function SpecMovedOn({ specId, rankedVersion, rankedPayload, movedOn, schema, advice }: SpecMovedOnProps) {
  const rows = useMemo(() => readableChanges(schema, movedOn.changes, rankedPayload, movedOn.latestPayload), [schema, movedOn, rankedPayload]);
  const history = `${paths.specHistory.href(specId)}?from=${rankedVersion}&to=${movedOn.latestVersion}`;
  return (
    <aside aria-label="The spec has moved on" className="rounded-lg border border-note/50 bg-note-soft/60 px-4 py-3 text-sm dark:border-note/40 dark:bg-note/15">
      <p>
        <span className="font-medium">The spec has moved on to version {movedOn.latestVersion}.</span> This proposal ranks version {rankedVersion}. {advice}
      </p>
      {movedOn.latestNote && (
        <p className="mt-1 break-words">
          <span className="text-ink-soft dark:text-night-ink-soft">Note on version {movedOn.latestVersion}:</span> “{movedOn.latestNote}”
        </p>
      )}
      <details className="mt-2">
        <summary className="cursor-pointer font-medium text-fern dark:text-fern-bright">
          {rows.length === 1 ? '1 field differs' : `${rows.length} fields differ`} from version {rankedVersion} to version {movedOn.latestVersion}
        </summary>
        <div className="mt-2 rounded-md bg-sheet p-3 dark:bg-night-sheet">
          <ChangesTable rows={rows} from={rankedVersion} to={movedOn.latestVersion} />
          <Link to={history} className="mt-2 inline-block text-fern underline dark:text-fern-bright">
            Open the spec’s history
          </Link>
        </div>
      </details>
    </aside>
  );
}
