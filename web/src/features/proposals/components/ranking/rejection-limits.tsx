import type { RecommendOption } from '#shared/engine/recommend';
import { formatQuantity } from '#shared/units/format-quantity';
import { rejectionLimitView } from '../../lib/rejection-limits';

/**
 * What limits the option's rejection at the spec frequency: each part with its elements and
 * values, its share as a bar, and the rejection with it removed. Nothing when the option has no
 * such figures (not solved, or ranked before the engine gave them).
 */
export function RejectionLimits({ option }: { option: RecommendOption }) {
  const limits = option.rejectionLimits;
  const view = rejectionLimitView(limits, limits ? formatQuantity(limits.frequencyHz, 'Hz') : '');
  if (!view) return null;
  return (
    <div className="space-y-2 text-sm" data-rejection-limits>
      <p>
        {view.heading} <span className="font-medium">{view.lead}</span>
      </p>
      <table className="w-full">
        <caption className="sr-only">What limits the rejection at the spec frequency, with each part’s share</caption>
        <thead>
          <tr className="text-left text-xs text-ink-soft dark:text-night-ink-soft">
            <th scope="col" className="pr-3 pb-1 font-medium">Part</th>
            <th scope="col" className="hidden pr-3 pb-1 font-medium sm:table-cell">At the operating point</th>
            <th scope="col" className="pr-3 pb-1 text-right font-medium">Share</th>
            <th scope="col" className="hidden pb-1 text-right font-medium sm:table-cell">Without it</th>
          </tr>
        </thead>
        <tbody>
          {view.rows.map((row) => (
            <tr key={row.part} className="border-t border-rule/60 align-top dark:border-night-rule/60">
              <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                <span className="font-medium">{row.name}</span>
                {row.elements && <span className="block tabular-nums sm:hidden">{row.elements}</span>}
                <span className="block text-xs text-ink-soft dark:text-night-ink-soft">{row.note}</span>
                {row.without && <span className="block text-xs tabular-nums sm:hidden">without it: {row.without}</span>}
              </th>
              <td className="hidden py-1.5 pr-3 tabular-nums sm:table-cell">{row.elements}</td>
              <td className="py-1.5 pr-3 text-right">
                <span className="block font-medium tabular-nums whitespace-nowrap">{row.share}</span>
                <span aria-hidden="true" className="mt-1 ml-auto block h-1.5 w-16 rounded-sm bg-rule/60 sm:w-28 dark:bg-night-rule">
                  <span className="block h-full rounded-sm bg-fern dark:bg-fern-bright" style={{ width: `${Math.max(0, Math.min(100, row.sharePercent))}%` }} />
                </span>
              </td>
              <td className="hidden py-1.5 text-right text-xs whitespace-nowrap tabular-nums sm:table-cell">{row.without || '—'}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {view.offsetting.length > 0 && (
        <ul className="space-y-1 text-xs">
          {view.offsetting.map((text) => (
            <li key={text}>{text}</li>
          ))}
        </ul>
      )}
      <p className="text-xs text-ink-soft dark:text-night-ink-soft">
        A part’s share is how much of the rejection’s fall a small growth of it causes (its sensitivity in the whole solved circuit), out of
        all the parts that let common mode through; “without it” solves the circuit again with that capacitance removed. Estimates from the
        device model: confirm by simulation and bench measurement.
      </p>
    </div>
  );
}
