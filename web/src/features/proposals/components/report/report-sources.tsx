import { ENGINE_SOURCES } from '#shared/engine/sources';

/** The published methods behind the engine's formulas, each with its key as the code cites it. */
export function ReportSources() {
  return (
    <>
      <p className="mb-2 text-sm">
        The engine solves the stage&rsquo;s node equations with the device model below and quotes the textbook closed forms beside its results as sanity checks. Where they differ, the
        node solution (the same model SPICE solves) is the one used.
      </p>
      <ol className="space-y-1.5 text-sm">
        {ENGINE_SOURCES.map((source) => (
          <li key={source.key} className="report-keep grid grid-cols-[5.5rem_1fr] gap-x-2">
            <span className="font-mono text-xs leading-5">[{source.key}]</span>
            <span>
              <cite className="not-italic">{source.citation}</cite>
              <span className="block text-xs text-ink-soft dark:text-night-ink-soft">{source.usedFor}</span>
            </span>
          </li>
        ))}
      </ol>
      <p className="mt-2 text-xs text-ink-soft dark:text-night-ink-soft">The Monte Carlo&rsquo;s Gaussian resistor spread with 3σ equal to the tolerance is common practice, not a citation.</p>
    </>
  );
}
