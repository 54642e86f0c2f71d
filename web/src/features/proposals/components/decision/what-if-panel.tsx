import type { AnalyzeResult } from '#shared/engine/types';
import { formatQuantity } from '#shared/units/index';
import { Quantity } from '../../../../components/ui/quantity';
import { Verdict } from '../../../../components/ui/verdict';
import { ApiError } from '../../../../lib/api';
import type { Proposal } from '#shared/api/proposals';
import { cn } from '../../../../lib/cn';
import { topologyNameInText } from '../../../../lib/topology-names';
import type { WhatIf } from './use-what-if';
import { changeText, whatIfFigures } from './what-if-figures';

/**
 * The edited design's nominal figures beside the ranked option's of the same topology, with the
 * change, asked of the server as the values change. The full check over the spec's corners,
 * Monte Carlo included, is the full-check panel's on request, and the server's again when the
 * decision is recorded.
 */
export function WhatIfPanel({ proposal, whatIf, ranked }: { proposal: Proposal; whatIf: WhatIf; ranked: { topology: string; predicted: AnalyzeResult | null } | null }) {
  const { query, settling, hasDesign } = whatIf;
  const spec = proposal.specVersion.payload;
  const figures = whatIfFigures(spec.gain.output);
  const edited = query.data;
  const updating = hasDesign && (settling || query.isFetching);
  const error = hasDesign && !settling && query.error ? query.error : null;
  // Figures of an earlier design stay on screen while the next is analysed, in the soft ink, never faded below legibility.
  const stale = Boolean(edited) && (updating || !hasDesign);
  const rankedLabel = ranked ? `Ranked ${topologyNameInText(ranked.topology)}` : 'Ranked option';
  return (
    <section aria-labelledby="what-if-title" className="rounded-md border border-rule p-3 dark:border-night-rule">
      <header className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
        <h3 id="what-if-title" className="text-sm font-medium">
          What if: your values at nominal conditions
        </h3>
        <p role="status" aria-live="polite" className="text-xs text-ink-soft dark:text-night-ink-soft">
          {!hasDesign ? 'Waiting for readable values' : updating ? 'Analysing…' : edited ? 'Up to date' : ''}
        </p>
      </header>
      {error ? (
        <WhatIfError error={error} />
      ) : (
        <div className="relative overflow-x-auto">
          <table className="w-full text-sm" aria-busy={updating || undefined}>
            <caption className="sr-only">Key figures of the ranked option and of your values, with the change</caption>
            <thead className="text-left text-xs text-ink-soft dark:text-night-ink-soft">
              <tr>
                <th scope="col" className="py-1 pr-3 font-normal">Figure</th>
                <th scope="col" className="py-1 pr-3 text-right font-normal">{rankedLabel}</th>
                <th scope="col" className="py-1 pr-3 text-right font-normal">{stale ? 'Your values (not yet updated)' : 'Your values'}</th>
                <th scope="col" className="py-1 text-right font-normal">Change</th>
              </tr>
            </thead>
            <tbody>
              {figures.map((figure) => {
                const before = ranked?.predicted ? figure.read(ranked.predicted) : null;
                const after = edited ? figure.read(edited) : null;
                return (
                  <tr key={figure.id} className="border-t border-rule/60 dark:border-night-rule/60">
                    <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                      {figure.label}
                      {figure.id === 'gain' && <GainTarget gain={after} target={spec.gain.target} tolerancePercent={spec.gain.tolerancePercent} />}
                      {figure.id === 'power' && (
                        <span className="block text-xs text-ink-soft dark:text-night-ink-soft">budget {formatQuantity(spec.powerBudgetW, 'W')} at the worst corner</span>
                      )}
                    </th>
                    <td className="py-1.5 pr-3 text-right">
                      <Quantity value={before} unit={figure.unit} />
                    </td>
                    <td className={cn('py-1.5 pr-3 text-right', stale ? 'text-ink-soft dark:text-night-ink-soft' : 'font-medium')}>{edited ? <Quantity value={after} unit={figure.unit} /> : <span className="text-ink-soft">…</span>}</td>
                    <td className="py-1.5 text-right text-ink-soft tabular-nums dark:text-night-ink-soft">{changeText(figure, before, after) ?? '—'}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
      {edited && !error && <Warnings warnings={edited.warnings} />}
      <p className="mt-2 text-xs text-ink-soft dark:text-night-ink-soft">
        Nominal conditions only. The full check below runs every rule over the spec’s temperature and common-mode corners, Monte Carlo included, as recording the decision does.
      </p>
    </section>
  );
}

function GainTarget({ gain, target, tolerancePercent }: { gain: number | null; target: number; tolerancePercent: number }) {
  const band = `target ${formatQuantity(target, 'V/V')} ± ${formatQuantity(tolerancePercent, '%')}`;
  if (gain === null) return <span className="block text-xs text-ink-soft dark:text-night-ink-soft">{band}</span>;
  const inside = Math.abs(gain - target) <= (target * tolerancePercent) / 100;
  return (
    <span className="mt-0.5 flex items-center gap-1.5 text-xs text-ink-soft dark:text-night-ink-soft">
      {band}
      <Verdict kind={inside ? 'holds' : 'short'} label={inside ? 'inside' : 'outside'} />
    </span>
  );
}

function Warnings({ warnings }: { warnings: string[] }) {
  if (warnings.length === 0) return <p className="mt-2 text-xs text-ink-soft dark:text-night-ink-soft">No warnings from the analysis.</p>;
  return (
    <ul className="mt-2 space-y-1" aria-label="Warnings from the analysis">
      {warnings.map((w) => (
        <li key={w} className="flex items-start gap-2 text-xs">
          <Verdict kind="note" label="Warning" />
          <span>{w}</span>
        </li>
      ))}
    </ul>
  );
}

function WhatIfError({ error }: { error: Error }) {
  const apiError = error instanceof ApiError ? error : null;
  const title = apiError?.status === 422 ? 'The engine cannot solve these values' : apiError?.status === 400 ? 'The server refused these values' : 'The what-if could not be computed';
  return (
    <div role="alert" className="rounded-md bg-short-soft p-3 text-sm text-short dark:bg-short/20 dark:text-short-bright">
      <p className="font-medium">{title}</p>
      <p className="mt-1">{error.message}</p>
      {apiError && apiError.details.length > 0 && (
        <ul className="mt-1 list-inside list-disc">
          {apiError.details.map((d) => (
            <li key={`${d.path}${d.message}`}>
              <code>{d.path || '(design)'}</code>: {d.message}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
