/** The readable differences between two versions: field, what happened (in words), before, after. */
import { cn } from '../../../lib/cn';
import type { ReadableChange } from '../lib/spec-changes';

const KIND: Record<ReadableChange['kind'], { word: string; glyph: string; className: string }> = {
  changed: { word: 'Changed', glyph: '~', className: 'bg-note-soft text-note dark:bg-note/25 dark:text-note-bright' },
  added: { word: 'Added', glyph: '+', className: 'bg-holds-soft text-holds dark:bg-holds/25 dark:text-holds-bright' },
  removed: { word: 'Removed', glyph: '−', className: 'bg-short-soft text-short dark:bg-short/25 dark:text-short-bright' },
};

export function ChangesTable({ rows, from, to }: { rows: readonly ReadableChange[]; from: number; to: number }) {
  return (
    // Below 640 px each change stacks into a block of its own (field, change, then the two values).
    <table className="block w-full text-sm sm:table">
      <caption className="mb-2 block text-left text-sm text-ink-soft sm:table-caption dark:text-night-ink-soft">
        {rows.length === 1 ? '1 field differs' : `${rows.length} fields differ`} between version {from} and version {to}.
      </caption>
      <thead className="sr-only sm:not-sr-only sm:table-header-group">
        <tr className="border-b border-rule text-left text-xs tracking-wide text-ink-soft uppercase dark:border-night-rule dark:text-night-ink-soft">
          <th scope="col" className="py-1.5 pr-3 font-medium">
            Field
          </th>
          <th scope="col" className="py-1.5 pr-3 font-medium">
            Change
          </th>
          <th scope="col" className="py-1.5 pr-3 font-medium">
            Version {from}
          </th>
          <th scope="col" className="py-1.5 font-medium">
            Version {to}
          </th>
        </tr>
      </thead>
      <tbody className="block sm:table-row-group">
        {rows.map((row) => {
          const kind = KIND[row.kind];
          return (
            <tr key={row.path} className="grid grid-cols-[auto_1fr] gap-x-3 border-b border-rule/60 py-2 align-top sm:table-row sm:py-0 dark:border-night-rule/60">
              <th scope="row" className="col-span-2 text-left font-medium sm:py-2 sm:pr-3">
                {row.label}
              </th>
              <td className="col-span-2 pt-1 sm:py-2 sm:pr-3">
                <span className={cn('inline-flex items-center gap-1 rounded px-1.5 py-0.5 text-xs font-medium whitespace-nowrap', kind.className)}>
                  <span aria-hidden="true">{kind.glyph}</span>
                  {kind.word}
                </span>
              </td>
              <td className={cn('pt-1 text-ink-soft tabular-nums sm:py-2 sm:pr-3 dark:text-night-ink-soft', row.kind === 'added' && 'italic')}>
                <span className="mr-1 text-xs sm:hidden">v{from}</span>
                {row.before}
              </td>
              <td className="pt-1 tabular-nums sm:py-2">
                <span className={cn(row.kind === 'removed' ? 'text-ink-soft italic dark:text-night-ink-soft' : 'font-medium')}>
                  <span aria-hidden="true" className="mr-1 text-ink-soft dark:text-night-ink-soft">
                    →
                  </span>
                  {row.after}
                </span>
                {row.detail && <span className="mt-0.5 block text-xs text-ink-soft dark:text-night-ink-soft">{row.detail}</span>}
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
