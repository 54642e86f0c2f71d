/** The options table's filters: topology text and "passing only", with how many rows remain. */
export function TableFilters({
  text,
  onText,
  passingOnly,
  onPassingOnly,
  shown,
  total,
}: {
  text: string;
  onText: (text: string) => void;
  passingOnly: boolean;
  onPassingOnly: (on: boolean) => void;
  shown: number;
  total: number;
}) {
  return (
    <div className="mb-2 flex flex-wrap items-center gap-x-5 gap-y-2 text-sm">
      <label className="flex items-center gap-2">
        <span>Filter tails</span>
        <input
          type="search"
          value={text}
          onChange={(event) => onText(event.target.value)}
          placeholder="e.g. mirror"
          className="w-44 rounded-md border border-rule bg-sheet px-2 py-1 dark:border-night-rule dark:bg-night"
        />
      </label>
      <label className="flex items-center gap-2">
        <input type="checkbox" checked={passingOnly} onChange={(event) => onPassingOnly(event.target.checked)} className="h-4 w-4 accent-fern" />
        <span>Passing only</span>
      </label>
      <span role="status" className="ml-auto text-xs text-ink-soft dark:text-night-ink-soft">
        {shown === total ? `${total} options` : `${shown} of ${total} options shown`}
      </span>
    </div>
  );
}
