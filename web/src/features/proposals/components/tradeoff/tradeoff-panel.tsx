import { useId, useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import type { Proposal } from '#shared/api/proposals';
import type { RecommendOption } from '#shared/engine/recommend';
import type { TradeoffSweepPoint } from '#shared/engine/tradeoff-sweep';
import { formatQuantity } from '#shared/units/format-quantity';
import { parseQuantity } from '#shared/units/parse-quantity';
import { windowRequirementText } from '#shared/text/engine-notes';
import { PlotFigure } from '../../../../components/charts/plot-figure';
import { Loading } from '../../../../components/ui/feedback';
import { Sheet } from '../../../../components/ui/sheet';
import { Verdict } from '../../../../components/ui/verdict';
import { cn } from '../../../../lib/cn';
import { topologyName } from '../../../../lib/topology-names';
import { tradeoffQuery } from '../../api/tradeoff-queries';
import { formatTradeoff } from '../../lib/tradeoff-columns';
import { feasibleBand, ownCurrentA, sweepCurrentsA, SWEEP_MAX_A, SWEEP_MIN_A, tradeoffCharts, whatIfRows, type TradeoffChart } from '../../lib/tradeoff-plot';
import { useDebouncedValue } from '../decision/use-debounced-value';
import { WHAT_IF_DEBOUNCE_MS } from '../decision/use-what-if';
import { TradeoffChartView } from './lazy-tradeoff-chart';

/**
 * What the tail current trades, for one ranked option: each figure the spec sets a target for
 * (and power and gain) against tail current from a tenth to ten times the option's own, the
 * spec's limit as a line, the feasible window shaded, the sized current marked; a what-if current
 * (slider or typed, "450 µA") re-sized by the server as it changes, its figures listed against
 * each limit.
 */
export function TradeoffPanel({ proposal, option }: { proposal: Proposal; option: RecommendOption }) {
  const ownA = ownCurrentA(option);
  const facts = option.figures;
  if (ownA === null || !facts) return null;
  return <TradeoffView key={option.topology} proposal={proposal} option={option} ownA={ownA} facts={facts} />;
}

function TradeoffView({ proposal, option, ownA, facts }: { proposal: Proposal; option: RecommendOption; ownA: number; facts: NonNullable<RecommendOption['figures']> }) {
  const spec = proposal.specVersion.payload as object;
  const currentsA = useMemo(() => sweepCurrentsA(ownA), [ownA]);
  const sweep = useQuery(tradeoffQuery(spec, option.topology, currentsA));
  const [text, setText] = useState(() => formatQuantity(ownA, 'A', 3));
  const reading = readCurrent(text);
  const whatIfA = reading.ok ? reading.valueA : null;
  const settledA = useDebouncedValue(whatIfA, WHAT_IF_DEBOUNCE_MS);
  const whatIf = useQuery({ ...tradeoffQuery(spec, option.topology, [settledA ?? ownA]), enabled: settledA !== null });
  const points = sweep.data && !sweep.isPlaceholderData ? sweep.data.points : null;
  const charts = useMemo(() => (points ? tradeoffCharts(points, facts) : []), [points, facts]);
  const feasible = useMemo(() => feasibleBand(option), [option]);
  const updating = whatIfA !== null && (whatIfA !== settledA || whatIf.isFetching);
  const name = topologyName(option.topology);
  return (
    <Sheet title={`What the tail current trades: ${name}`} aria-label="What the tail current trades">
      <p className="mb-3 max-w-3xl text-sm text-ink-soft dark:text-night-ink-soft">
        <WindowSentence option={option} /> Point at a plot to read a figure at a swept current.
      </p>
      <CurrentControl text={text} onText={setText} reading={reading} ownA={ownA} lowA={currentsA[0]} highA={currentsA[currentsA.length - 1]} />
      {/* On a phone the what-if figures come first, next to the control that moves them. */}
      <div className="mt-4 grid gap-6 lg:grid-cols-[minmax(0,1fr)_19rem]">
        <div className="min-w-0">
          {sweep.isError ? (
            <Problem title="The trade-off curves could not be computed" message={sweep.error.message} />
          ) : !points ? (
            <Loading what={`Sizing the ${name.toLowerCase()} at ${currentsA.length} tail currents`} />
          ) : (
            <>
              <div className="grid gap-x-6 gap-y-5 md:grid-cols-2">
                {charts.map((chart) => (
                  <PlotFigure key={chart.id} title={`${chart.title} against tail current`} summary={chartSummary(chart, currentsA)}>
                    <TradeoffChartView chart={chart} currentsA={currentsA} feasible={feasible} sizedA={ownA} whatIfA={whatIfA} />
                  </PlotFigure>
                ))}
              </div>
              <Unsolved points={points} />
            </>
          )}
        </div>
        <WhatIfFigures charts={charts} point={whatIf.data?.points[0] ?? null} updating={updating} pending={!whatIf.data && whatIf.isFetching} error={whatIf.isError ? whatIf.error.message : null} />
      </div>
      <p className="mt-4 border-t border-rule/60 pt-2 text-xs text-ink-soft dark:border-night-rule/60 dark:text-night-ink-soft">
        Figures at the spec’s nominal temperature and input common mode, the option re-sized at each current on the spec’s resistor series; the table’s checks take the worst corner, so a
        figure close to its limit here may fall short there. {proposal.result.notice}
      </p>
    </Sheet>
  );
}

/** The typed current read as amperes, within what the sizing works at. */
function readCurrent(text: string): { ok: true; valueA: number } | { ok: false; message: string } {
  const parsed = parseQuantity(text, 'A');
  if (!parsed.ok) return { ok: false, message: parsed.message };
  if (!(parsed.value >= SWEEP_MIN_A && parsed.value <= SWEEP_MAX_A)) return { ok: false, message: `the sizing works from ${formatQuantity(SWEEP_MIN_A, 'A')} to ${formatQuantity(SWEEP_MAX_A, 'A')}` };
  return { ok: true, valueA: parsed.value };
}

function CurrentControl({
  text,
  onText,
  reading,
  ownA,
  lowA,
  highA,
}: {
  text: string;
  onText: (text: string) => void;
  reading: ReturnType<typeof readCurrent>;
  ownA: number;
  lowA: number;
  highA: number;
}) {
  const id = useId();
  const sliderA = reading.ok ? Math.min(Math.max(reading.valueA, lowA), highA) : ownA;
  return (
    <div className="flex flex-wrap items-end gap-x-4 gap-y-2 rounded-md border border-rule p-3 dark:border-night-rule">
      <div className="min-w-0 grow basis-64">
        <label htmlFor={`${id}-slider`} className="mb-1 block text-sm font-medium">
          What-if tail current
        </label>
        <input
          id={`${id}-slider`}
          type="range"
          min={Math.log10(lowA)}
          max={Math.log10(highA)}
          step={0.01}
          value={Math.log10(sliderA)}
          onChange={(e) => onText(formatQuantity(10 ** Number(e.target.value), 'A', 3))}
          aria-valuetext={formatQuantity(sliderA, 'A', 3)}
          className="w-full accent-fern"
        />
        <div className="flex justify-between text-xs text-ink-soft tabular-nums dark:text-night-ink-soft" aria-hidden="true">
          <span>{formatQuantity(lowA, 'A', 2)}</span>
          <span>{formatQuantity(highA, 'A', 2)}</span>
        </div>
      </div>
      <div className="w-40">
        <label htmlFor={`${id}-text`} className="mb-1 block text-sm font-medium">
          Typed
        </label>
        <input
          id={`${id}-text`}
          type="text"
          autoComplete="off"
          spellCheck={false}
          value={text}
          onChange={(e) => onText(e.target.value)}
          aria-invalid={reading.ok ? undefined : true}
          aria-describedby={`${id}-reading`}
          className={cn('w-full rounded-md border bg-sheet px-3 py-1.5 font-mono tabular-nums dark:bg-night', reading.ok ? 'border-rule dark:border-night-rule' : 'border-short dark:border-short-bright')}
        />
      </div>
      <button type="button" onClick={() => onText(formatQuantity(ownA, 'A', 3))} className="rounded-md border border-rule px-2.5 py-1.5 text-sm hover:bg-paper dark:border-night-rule dark:hover:bg-night">
        Back to the sized {formatQuantity(ownA, 'A', 3)}
      </button>
      <p id={`${id}-reading`} className={cn('basis-full text-xs', reading.ok ? 'text-ink-soft dark:text-night-ink-soft' : 'text-short dark:text-short-bright')}>
        {reading.ok ? (
          <>= {formatQuantity(reading.valueA, 'A', 4)}; type a current such as “450 µA” or “1.2m”, or move the slider.</>
        ) : (
          <>
            <span aria-hidden="true">✕ </span>
            {reading.message}
          </>
        )}
      </p>
    </div>
  );
}

/** The what-if current's figures against each limit, beside the charts. */
function WhatIfFigures({ charts, point, updating, pending, error }: { charts: TradeoffChart[]; point: TradeoffSweepPoint | null; updating: boolean; pending: boolean; error: string | null }) {
  const rows = point?.ok && charts.length ? whatIfRows(charts, point) : null;
  return (
    <section aria-labelledby="what-if-current-title" className="self-start rounded-md border border-rule p-3 max-lg:order-first lg:sticky lg:top-4 dark:border-night-rule">
      <header className="mb-2 flex items-baseline justify-between gap-2">
        <h3 id="what-if-current-title" className="text-sm font-medium">
          At the what-if current
        </h3>
        <p role="status" aria-live="polite" className="text-xs text-ink-soft dark:text-night-ink-soft">
          {pending || updating ? 'Sizing…' : point ? 'Up to date' : ''}
        </p>
      </header>
      {error ? (
        <Problem title="The what-if could not be computed" message={error} />
      ) : point && !point.ok ? (
        <Problem title={`Not solvable at ${formatQuantity(point.tailCurrentA, 'A')}`} message={point.error} />
      ) : !rows ? (
        <p className="py-4 text-sm text-ink-soft dark:text-night-ink-soft">{pending || charts.length === 0 ? 'Waiting for the figures…' : 'Type a current to see its figures.'}</p>
      ) : (
        <>
          <p className="mb-2 text-xs text-ink-soft dark:text-night-ink-soft">
            Sized for {formatQuantity(point!.ok ? point!.tailCurrentA : 0, 'A')}; the design draws {formatQuantity(point!.ok ? point!.solvedTailCurrentA : 0, 'A')}.
          </p>
          <table className={cn('w-full text-sm', updating && 'text-ink-soft dark:text-night-ink-soft')} aria-busy={updating || undefined}>
            <caption className="sr-only">Nominal figures at the what-if current, each against its limit</caption>
            <tbody>
              {rows.map((row) => (
                <tr key={row.id} className="border-t border-rule/60 first:border-t-0 dark:border-night-rule/60">
                  <th scope="row" className="py-1.5 pr-2 text-left align-top font-normal">
                    {row.title}
                    <span className="block text-xs text-ink-soft dark:text-night-ink-soft">{row.limitText}</span>
                  </th>
                  <td className="py-1.5 pr-2 text-right align-top font-medium whitespace-nowrap tabular-nums">{row.text}</td>
                  <td className="py-1.5 text-right align-top">{row.meets === null ? <Verdict kind="not-applicable" /> : <Verdict kind={row.meets ? 'holds' : 'short'} label={row.meets ? 'Meets' : 'Misses'} />}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
    </section>
  );
}

/** The points of the sweep the engine could not size or solve, each with its reason. */
function Unsolved({ points }: { points: TradeoffSweepPoint[] }) {
  const failed = points.filter((p): p is Extract<TradeoffSweepPoint, { ok: false }> => !p.ok);
  if (failed.length === 0) return null;
  return (
    <div role="note" className="mt-4 rounded-md border border-note/40 bg-note-soft/50 p-3 text-sm dark:bg-note/15">
      <p className="font-medium">
        Not solvable at {failed.length} of {points.length} currents (gaps in the curves):
      </p>
      <ul className="mt-1 list-inside list-disc text-xs">
        {failed.slice(0, 5).map((p) => (
          <li key={p.tailCurrentA}>
            {formatQuantity(p.tailCurrentA, 'A')}: {p.error}
          </li>
        ))}
        {failed.length > 5 && <li>and {failed.length - 5} more</li>}
      </ul>
    </div>
  );
}

function Problem({ title, message }: { title: string; message: string }) {
  return (
    <div role="alert" className="rounded-md bg-short-soft p-3 text-sm text-short dark:bg-short/20 dark:text-short-bright">
      <p className="font-medium">{title}</p>
      <p className="mt-1">{message}</p>
    </div>
  );
}

/** The window the option was sized in, in one sentence (or why none is shaded). */
function WindowSentence({ option }: { option: RecommendOption }) {
  const w = option.tailCurrentWindow;
  const amps = (a: number) => formatQuantity(a, 'A');
  if (!w) {
    return <>The spec sets no target that bounds the tail current (noise, slew rate, bandwidth or bias current), so no window is shaded; the line marks the current the option is sized at.</>;
  }
  if (w.empty) {
    return (
      <>
        No tail current meets every target: {windowRequirementText(w.lower!.requirement)} needs {amps(w.lower!.currentA)} or more, {windowRequirementText(w.upper!.requirement)} allows {amps(w.upper!.currentA)} at
        most. The option is sized at {amps(w.currentA)}, set by {windowRequirementText(w.setBy)}; nothing is shaded.
      </>
    );
  }
  const from = w.lower ? `from ${amps(w.lower.currentA)} (${windowRequirementText(w.lower.requirement)})` : 'from the smallest current';
  const to = w.upper ? `to ${amps(w.upper.currentA)} (${windowRequirementText(w.upper.requirement)})` : 'upward';
  return (
    <>
      The shaded window is where the targets allow the tail current, {from} {to}. The option is sized at {amps(w.currentA)}, set by {windowRequirementText(w.setBy)}.
    </>
  );
}

/** What a chart shows, for a screen reader: the figure at both ends of the sweep and the limit. */
function chartSummary(chart: TradeoffChart, currentsA: number[]): string {
  const first = chart.values.findIndex((v) => v !== null);
  const last = chart.values.length - 1 - [...chart.values].reverse().findIndex((v) => v !== null);
  const ends =
    first >= 0
      ? ` From ${formatTradeoff(chart.values[first]!, chart.unit)} at ${formatQuantity(currentsA[first], 'A')} to ${formatTradeoff(chart.values[last]!, chart.unit)} at ${formatQuantity(currentsA[last], 'A')}.`
      : ' No figure could be computed.';
  return `Nominal ${chart.title.toLowerCase()} against tail current (log axis), limit ${chart.limitText}.${ends}`;
}
