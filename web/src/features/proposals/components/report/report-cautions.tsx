/** The hazard cautions, before anything else, and whose word counts where they apply. */
function withoutCautionWord(text: string): string {
  const rest = text.replace(/^caution:\s*/i, '');
  return rest.charAt(0).toUpperCase() + rest.slice(1);
}

export function ReportCautions({ cautions }: { cautions: string[] }) {
  if (cautions.length === 0) {
    return <p className="text-sm">None. The rule set raised no caution for this spec (rail voltage, patient-connected input, mains-referenced input).</p>;
  }
  return (
    <div role="note" aria-label="Cautions" className="report-cautions rounded-lg border-2 border-note bg-note-soft px-4 py-3 dark:bg-note/20">
      <p className="flex items-center gap-2 font-semibold text-note dark:text-note-bright">
        <span aria-hidden="true" className="text-lg leading-none">
          ⚠
        </span>
        {cautions.length === 1 ? 'Caution' : `${cautions.length} cautions`}: read before using any design in this report
      </p>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-sm">
        {cautions.map((caution) => (
          <li key={caution}>{withoutCautionWord(caution)}</li>
        ))}
      </ul>
      <p className="mt-2 text-sm font-medium">
        This report does not replace the applicable standards, local codes or licensed practice: where they apply, they govern, and a qualified person must confirm the design against them.
      </p>
    </div>
  );
}
