import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnFiltersState,
  type Header,
  type SortingState,
} from '@tanstack/react-table';
import { useMemo, useState, type KeyboardEvent } from 'react';
import type { TopologyId } from '#shared/engine/types';
import { cn } from '../../../../lib/cn';
import { outputRejectionNote, type OptionRow, type SpecTargets } from '../../lib/option-rows';
import { optionColumns } from './option-columns';
import { TableFilters } from './table-filters';

const SORT_GLYPH = { asc: '▲', desc: '▼' } as const;

function HeaderCell({ header }: { header: Header<OptionRow, unknown> }) {
  const numeric = header.column.columnDef.meta?.numeric;
  const sorted = header.column.getIsSorted();
  // The top row only heads groups; above an ungrouped column it holds an empty cell, not a header.
  if (header.isPlaceholder) return <td colSpan={header.colSpan} />;
  const content = flexRender(header.column.columnDef.header, header.getContext());
  return (
    <th
      colSpan={header.colSpan}
      scope="col"
      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : header.column.getCanSort() && header.subHeaders.length === 0 ? 'none' : undefined}
      className={cn('px-1.5 py-1.5 align-bottom font-normal', numeric ? 'text-right' : 'text-left')}
    >
      {header.column.getCanSort() && header.subHeaders.length === 0 ? (
        <button
          type="button"
          onClick={header.column.getToggleSortingHandler()}
          className={cn('inline-flex items-end gap-1 rounded hover:text-fern dark:hover:text-fern-soft', numeric && 'flex-row-reverse text-right')}
        >
          {content}
          <span aria-hidden="true" className={cn('w-2 text-[0.6rem]', !sorted && 'opacity-30')}>
            {sorted ? SORT_GLYPH[sorted] : '↕'}
          </span>
        </button>
      ) : (
        content
      )}
    </th>
  );
}

/**
 * Every tail option in one dense table: sortable by any figure, filtered by topology text and
 * "passing only"; a row (or its name, from the keyboard) selects the option for the detail below.
 * Arrow keys move the selection between rows.
 */
export function OptionsTable({
  rows,
  targets,
  selected,
  onSelect,
  current = null,
}: {
  rows: OptionRow[];
  targets: SpecTargets | null;
  selected: TopologyId | null;
  onSelect: (topology: TopologyId) => void;
  /** The ranked option that is the proposal's current design, and its word ("decided", "signed off"); null while it is own values or none. */
  current?: { topology: string; word: string } | null;
}) {
  const columns = useMemo(() => optionColumns(targets), [targets]);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'rank', desc: false }]);
  const [columnFilters, setColumnFilters] = useState<ColumnFiltersState>([]);
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting, columnFilters },
    onSortingChange: setSorting,
    onColumnFiltersChange: setColumnFilters,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });
  const shown = table.getRowModel().rows;
  const moveSelection = (event: KeyboardEvent<HTMLButtonElement>, index: number) => {
    const step = event.key === 'ArrowDown' ? 1 : event.key === 'ArrowUp' ? -1 : 0;
    const next = shown[index + step];
    if (step === 0 || !next) return;
    event.preventDefault();
    onSelect(next.original.topology);
    event.currentTarget.closest('tbody')?.querySelectorAll<HTMLButtonElement>('button[data-option]')[index + step]?.focus();
  };
  const column = (id: string) => table.getColumn(id)!;
  return (
    <div>
      <TableFilters
        text={(column('topology').getFilterValue() as string) ?? ''}
        onText={(text) => column('topology').setFilterValue(text || undefined)}
        passingOnly={Boolean(column('verdict').getFilterValue())}
        onPassingOnly={(on) => column('verdict').setFilterValue(on || undefined)}
        shown={shown.length}
        total={rows.length}
      />
      <div className="relative overflow-x-auto">
        <table className="w-full border-collapse text-sm">
          <caption className="sr-only">Tail options, ranked. Select an option to see its detail below.</caption>
          <thead className="text-xs text-ink dark:text-night-ink">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b border-rule last:border-ink-soft/40 dark:border-night-rule">
                {group.headers.map((header) => (
                  <HeaderCell key={header.id} header={header} />
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {shown.map((row, index) => {
              const option = row.original;
              const isSelected = option.topology === selected;
              const isCurrent = current?.topology === option.topology;
              return (
                <tr
                  key={row.id}
                  onClick={() => onSelect(option.topology)}
                  data-selected={isSelected || undefined}
                  data-current={isCurrent || undefined}
                  className={cn(
                    'cursor-pointer border-b border-rule/70 dark:border-night-rule/70',
                    isSelected ? 'bg-fern-soft/70 dark:bg-fern/25' : 'hover:bg-paper dark:hover:bg-night',
                    (current ? isCurrent : option.recommended) && 'shadow-[inset_3px_0_0_var(--color-fern)]',
                  )}
                >
                  {row.getVisibleCells().map((cell) =>
                    cell.column.id === 'topology' ? (
                      <th key={cell.id} scope="row" className="px-1.5 py-1.5 text-left font-normal whitespace-nowrap">
                        <button
                          type="button"
                          data-option={option.topology}
                          aria-pressed={isSelected}
                          aria-controls="option-detail"
                          onClick={(event) => {
                            event.stopPropagation();
                            onSelect(option.topology);
                          }}
                          onKeyDown={(event) => moveSelection(event, index)}
                          className="rounded text-left font-medium hover:text-fern dark:hover:text-fern-soft"
                        >
                          {option.name}
                        </button>
                        {option.recommended && (
                          <span className="ml-1.5 text-fern dark:text-fern-bright" title="Recommended">
                            <span aria-hidden="true">◆</span>
                            <span className="sr-only"> (recommended)</span>
                          </span>
                        )}
                        {isCurrent && current && (
                          <span className="ml-1.5 rounded-sm border border-fern px-1 text-[0.65rem] font-medium tracking-wide text-fern uppercase dark:border-fern-bright dark:text-fern-bright">
                            {current.word}
                          </span>
                        )}
                      </th>
                    ) : (
                      <td key={cell.id} className={cn('px-1.5 py-1.5', cell.column.columnDef.meta?.numeric ? 'text-right' : 'text-left')}>
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                      </td>
                    ),
                  )}
                </tr>
              );
            })}
            {shown.length === 0 && (
              <tr>
                <td colSpan={table.getVisibleLeafColumns().length} className="px-2 py-6 text-center text-ink-soft dark:text-night-ink-soft">
                  No option matches the filter.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-xs text-ink-soft dark:text-night-ink-soft">
        ◆ recommended · {current ? `${current.word}: the proposal’s current design (marked at the left edge) · ` : ''}<span className="text-short dark:text-short-bright">✕</span> figure short of a blocking check · <span className="text-note dark:text-note-bright">!</span> advisory
        check not met · margins are + on the safe side · select a row (or use ↑ ↓ on a name) to see the option below
      </p>
      {targets && <p className="mt-1 text-xs text-ink-soft dark:text-night-ink-soft">{outputRejectionNote(targets)}</p>}
    </div>
  );
}
