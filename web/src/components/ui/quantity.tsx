import { formatQuantity } from '#shared/units/format-quantity';

/** A figure with its unit in engineering notation ("4.7 kΩ", "120 µA"); an em dash when absent. */
export function Quantity({ value, unit, digits = 3 }: { value: number | null | undefined; unit: string; digits?: number }) {
  if (value === null || value === undefined || Number.isNaN(value)) return <span className="text-ink-soft dark:text-night-ink-soft">—</span>;
  return <span className="tabular-nums whitespace-nowrap">{formatQuantity(value, unit, digits)}</span>;
}
