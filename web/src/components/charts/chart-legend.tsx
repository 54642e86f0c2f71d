/** The charts' own legend: a drawn sample of each line (colour, dash, marker) with its name and the value under the cursor. */
export interface LegendItem {
  label: string;
  stroke: string;
  dash?: number[];
  width?: number;
  marker?: 'filled' | 'hollow';
  /** A filled area (histogram) instead of a line. */
  fill?: string;
  /** Soft words after the label, e.g. "falls short". */
  note?: string;
  value?: string | null;
}

function Sample({ item }: { item: LegendItem }) {
  return (
    <svg width={30} height={12} aria-hidden="true" className="shrink-0">
      {item.fill ? (
        <rect x={3} y={1.5} width={24} height={9} fill={item.fill} stroke={item.stroke} strokeWidth={1} />
      ) : (
        <line x1={1} y1={6} x2={29} y2={6} stroke={item.stroke} strokeWidth={item.width ?? 1.5} strokeDasharray={item.dash?.length ? item.dash.join(' ') : undefined} />
      )}
      {item.marker && <circle cx={15} cy={6} r={3} fill={item.marker === 'filled' ? item.stroke : 'none'} stroke={item.stroke} strokeWidth={1.4} />}
    </svg>
  );
}

export function ChartLegend({ items, at }: { items: LegendItem[]; at: string | null }) {
  return (
    <div className="mt-2 text-xs">
      <p className="mb-1 text-ink-soft dark:text-night-ink-soft">{at ? `Values at ${at}` : 'Point at the plot to read values.'}</p>
      <ul className="flex flex-wrap gap-x-4 gap-y-1">
        {items.map((item) => (
          <li key={item.label} className="flex items-center gap-1.5">
            <Sample item={item} />
            <span>
              {item.label}
              {item.note && <span className="text-ink-soft dark:text-night-ink-soft"> · {item.note}</span>}
            </span>
            {at && <span className="font-medium tabular-nums">{item.value ?? '—'}</span>}
          </li>
        ))}
      </ul>
    </div>
  );
}
