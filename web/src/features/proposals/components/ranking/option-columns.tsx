/**
 * Columns of the options table: every figure sortable, the topology filterable by text, the
 * verdict by "passing only". Figures whose prefix varies (Ω, A, W, V) carry their unit in the
 * cell; dB, % and V/V columns say their unit once, in the heading.
 */
import { createColumnHelper, type ColumnDef, type RowData } from '@tanstack/react-table';
import { formatQuantity } from '#shared/units/format-quantity';
import { OptionVerdict } from '../../../../components/ui/verdict';
import { formatDeviationPercent, formatFixed, formatMargin, formatPercent, formatSignificant } from '#shared/units/figures';
import { matchesTopologyText, rejectionColumns, type OptionRow, type RuledFigure, type SpecTargets } from '../../lib/option-rows';
import { formatTradeoff } from '../../lib/tradeoff-columns';
import { ColumnTitle } from './column-title';
import { FigureCell } from './figure-cell';

declare module '@tanstack/react-table' {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface ColumnMeta<TData extends RowData, TValue> {
    /** Right-aligned, tabular figures. */
    numeric?: boolean;
  }
}

type NumericField = RuledFigure | 'tailImpedanceAtFrequencyOhm' | 'cmrrDcDb' | 'tailCurrentA';

const column = createColumnHelper<OptionRow>();
/** Missing figures (unsolved options) sort last whichever the direction. */
const toSortable = (value: number | null) => value ?? undefined;

const dbText = (v: number) => formatFixed(v, 1);
const percentText = (v: number) => formatFixed(v, 1).replace(/\.0$/, '');
const quantity = (unit: string) => (v: number) => formatQuantity(v, unit);
const margin = (v: number) => formatMargin(v, 'V');

function figureColumn(id: NumericField, format: (v: number) => string, title: string, sub?: string, forOutput = false) {
  return column.accessor((row) => toSortable(row[id]), {
    id,
    sortUndefined: 'last',
    meta: { numeric: true },
    header: () => <ColumnTitle title={title} sub={sub} forOutput={forOutput} />,
    cell: ({ row }) => {
      const value = row.original[id];
      return <FigureCell text={value === null ? null : format(value)} standing={row.original.standing[id as RuledFigure]} />;
    },
  });
}


// TanStack's ColumnDef is invariant in its value type; the array mixes number and string columns.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type AnyColumn = ColumnDef<OptionRow, any>;

/**
 * The table's columns for a spec (the mismatch and yield figures only for differential outputs;
 * a trade-off column only for each target the spec sets, its worst-corner figure with its unit).
 */
export function optionColumns(targets: SpecTargets | null): AnyColumn[] {
  const f = targets ? formatQuantity(targets.frequencyHz, 'Hz') : 'spec f';
  const tradeoffs = targets?.tradeoffs ?? [];
  const rejection: AnyColumn[] = rejectionColumns(targets).map((c) => figureColumn(c.field, c.unit === '%' ? percentText : dbText, c.title, c.sub, c.forOutput));
  return [
    column.accessor('rank', { header: () => <ColumnTitle title="#" />, meta: { numeric: true }, cell: ({ getValue }) => <span className="tabular-nums">{getValue()}</span> }),
    column.accessor('name', {
      id: 'topology',
      header: () => <ColumnTitle title="Tail" />,
      filterFn: (row, _id, text: string) => matchesTopologyText(row.original, text),
      // The cell (a selection button) is drawn by the table, which knows the selection.
      cell: ({ getValue }) => getValue(),
    }),
    column.accessor((row) => (row.passes ? 0 : row.unsolved ? 100 : row.blockingShortCount), {
      id: 'verdict',
      // Passing first on the first click; figures sort largest first (TanStack's default for numbers).
      sortDescFirst: false,
      header: () => <ColumnTitle title="Verdict" sub="blocking short" />,
      filterFn: (row, _id, passingOnly: boolean) => !passingOnly || row.original.passes,
      cell: ({ row }) => <OptionVerdict option={row.original} />,
    }),
    figureColumn('tailImpedanceAtFrequencyOhm', quantity('Ohm'), 'Tail |Z|', `at ${f}`),
    column.group({ id: 'rejection', header: () => <ColumnTitle title="CM rejection, dB" group />, columns: rejection }),
    column.accessor((row) => toSortable(row.gain), {
      id: 'gain',
      sortUndefined: 'last',
      meta: { numeric: true },
      header: () => <ColumnTitle title="Gain V/V" sub={targets ? `${formatQuantity(targets.gainTarget, '1')} ±${formatPercent(targets.gainTolerancePercent)}` : undefined} />,
      cell: ({ row }) => {
        const { gain, gainErrorPercent, standing } = row.original;
        const error = gainErrorPercent === null ? null : <span className="ml-1 text-[0.75rem] opacity-70">({formatDeviationPercent(gainErrorPercent)})</span>;
        return <FigureCell text={gain === null ? null : formatSignificant(gain)} standing={standing.gain} extra={error} />;
      },
    }),
    figureColumn('tailCurrentA', quantity('A'), 'Tail current', 'nominal'),
    figureColumn('powerWorstW', quantity('W'), 'Power', targets ? `worst, ≤ ${formatQuantity(targets.powerBudgetW, 'W')}` : 'worst corner'),
    ...(tradeoffs.length
      ? [
          column.group({
            id: 'tradeoffs',
            header: () => <ColumnTitle title="Spec targets, worst corner" group />,
            columns: tradeoffs.map((c) => figureColumn(c.field, (v) => formatTradeoff(v, c.unit), c.title, c.sub)),
          }),
        ]
      : []),
    column.group({
      id: 'headroom',
      header: () => <ColumnTitle title="Headroom margin" group />,
      columns: [figureColumn('icmLowMarginV', margin, 'ICM low'), figureColumn('icmHighMarginV', margin, 'ICM high'), figureColumn('swingMarginV', margin, 'Swing')],
    }),
  ];
}
