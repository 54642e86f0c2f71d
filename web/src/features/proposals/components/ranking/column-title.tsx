/** A column heading: the figure's name and, below it, what it is measured against. */
export function ColumnTitle({ title, sub, group }: { title: string; sub?: string; group?: boolean }) {
  return (
    <span className={group ? 'block border-b border-rule pb-0.5 text-center dark:border-night-rule' : 'block'}>
      <span className="block font-medium whitespace-nowrap">{title}</span>
      {sub && <span className="block text-[0.7rem] font-normal whitespace-nowrap text-ink-soft dark:text-night-ink-soft">{sub}</span>}
    </span>
  );
}
