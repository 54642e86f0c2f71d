/**
 * A column heading: the figure's name and, below it, what it is measured against. The rejection
 * that matters for the spec's output is marked ● (outputRejection), on the page and in the report.
 */
export function ColumnTitle({ title, sub, group, forOutput }: { title: string; sub?: string; group?: boolean; forOutput?: boolean }) {
  return (
    <span className={group ? 'block border-b border-rule pb-0.5 text-center dark:border-night-rule' : 'block'}>
      <span className="block font-medium whitespace-nowrap">
        {forOutput && (
          <span aria-hidden="true" className="mr-0.5 text-fern dark:text-fern-bright">
            ●
          </span>
        )}
        {title}
        {forOutput && <span className="sr-only"> (for the spec’s output)</span>}
      </span>
      {sub && <span className="block text-[0.7rem] font-normal whitespace-nowrap text-ink-soft dark:text-night-ink-soft">{sub}</span>}
    </span>
  );
}
