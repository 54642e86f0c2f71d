import type { Spec } from '#shared/engine/types';
import { specGroups } from '../lib/spec-rows';

/**
 * The requirement spec as field-and-value tables with units, one per group of the form, set two
 * groups abreast on a wide screen and on paper so the spec takes a page rather than three.
 */
export function SpecTable({ payload, title, version }: { payload: Spec; title: string; version: number }) {
  const groups = specGroups(payload);
  return (
    <>
      <p className="mb-2 text-xs text-ink-soft dark:text-night-ink-soft">
        {title}, version {version}: every field as saved, in SI units with engineering prefixes.
      </p>
      <div className="grid gap-x-8 gap-y-3 md:grid-cols-2 print:grid-cols-2 print:gap-y-2">
        {groups.map((group) => (
          <table key={group.title} className="report-keep w-full self-start text-sm">
            <caption className="pb-1 text-left text-xs font-semibold tracking-wide text-ink-soft uppercase dark:text-night-ink-soft">{group.title}</caption>
            <thead className="sr-only">
              <tr>
                <th scope="col">Field</th>
                <th scope="col">Value</th>
              </tr>
            </thead>
            <tbody>
              {group.rows.map((row) => (
                <tr key={row.path} className="border-t border-rule/60 align-top dark:border-night-rule/60">
                  <th scope="row" className="w-[55%] py-1 pr-3 text-left font-normal">
                    {row.label}
                  </th>
                  <td className="py-1 tabular-nums">{row.value}</td>
                </tr>
              ))}
            </tbody>
          </table>
        ))}
      </div>
    </>
  );
}
