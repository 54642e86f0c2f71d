/**
 * The report's plots as static SVG (they print as drawn): rejection against frequency for every
 * option, and the Monte Carlo rejection of the reported design (the engine's samples, and ngspice's
 * beside them once a SPICE Monte Carlo has finished). The same data as the page's plots
 * (lib/plot-data, lib/verification-plots), drawn without the chart library.
 */
import type { ReactNode } from 'react';
import type { MonteCarloVerificationResult } from '#shared/verification/types';
import { formatQuantity } from '#shared/units/format-quantity';
import type { TopologyId } from '#shared/engine/types';
import type { HistogramPlot, RejectionPlot } from '../../../lib/plot-data';
import { decadeTicksHz } from '../../../../../lib/plot-axes';
import { formatDb, formatPercent, formatTargetDb } from '#shared/units/figures';
import { rejectionSummary } from '../../../lib/plot-summaries';
import { monteCarloPlot } from '../../../lib/verification-plots';
import { linearScale, linePath, logScale, niceDomain, niceTicks, stepPath } from '../../../lib/svg-scale';
import { LineSample, PLOT_X, PLOT_Y, SvgFrame } from './svg-frame';

const ACCENT = 'var(--plot-accent)';
/** Other options: the text colour, lighter (black on paper when printed). */
const SOFT = 'currentColor';
const SHORT = 'var(--plot-short)';
const NOTE = 'var(--plot-note)';
/** Line patterns that tell options apart on a black-and-white print. */
const DASHES = ['', '7 3', '2 3', '9 3 2 3', '4 4', '12 3 2 3 2 3'];

function Figure({ title, summary, children, legend }: { title: string; summary: string; children: ReactNode; legend?: ReactNode }) {
  return (
    <figure className="report-keep min-w-0 max-w-2xl">
      <figcaption className="mb-1">
        <span className="block text-sm font-medium">{title}</span>
        <span className="block text-xs text-ink-soft dark:text-night-ink-soft">{summary}</span>
      </figcaption>
      {/* On a phone never narrower than 440 px, so its labels stay readable: the plot scrolls sideways (by keyboard too). */}
      <div className="relative max-sm:overflow-x-auto" tabIndex={0} aria-label={`${title}, scrolls sideways on a narrow screen`} role="group">
        <div className="max-sm:min-w-[440px]">{children}</div>
      </div>
      {legend}
    </figure>
  );
}

function Legend({ items }: { items: { key: string; sample: ReactNode; text: ReactNode }[] }) {
  return (
    <ul className="plot-legend mt-1 flex flex-wrap gap-x-4 gap-y-0.5 text-xs">
      {items.map((item) => (
        <li key={item.key} className="inline-flex items-center gap-1.5">
          {item.sample}
          <span>{item.text}</span>
        </li>
      ))}
    </ul>
  );
}

/** Every solved option's rejection against frequency (nominal), the reported design heavier in the accent colour. */
export function RejectionPlotSvg({ plot, subject, ownValues }: { plot: RejectionPlot; subject: TopologyId | null; ownValues?: { name: string; valuesDb: (number | null)[] } | null }) {
  const grid = plot.frequencyHz;
  const sx = logScale([grid[0], grid[grid.length - 1]], PLOT_X);
  const values = [...plot.series.flatMap((s) => s.valuesDb), ...(plot.mismatch?.valuesDb ?? []), ...(ownValues?.valuesDb ?? []), plot.requiredDb, plot.requiredWithMarginDb].filter((v): v is number => v !== null && Number.isFinite(v));
  const domain = niceDomain(Math.min(...values), Math.max(...values), 6);
  const sy = linearScale(domain, PLOT_Y);
  const yTicks = niceTicks(domain[0], domain[1], 6);
  const f = formatQuantity(plot.specFrequencyHz, 'Hz');
  const style = (i: number, topology: TopologyId) => (topology === subject ? { stroke: ACCENT, dash: '', width: 2.6 } : { stroke: SOFT, dash: DASHES[i % DASHES.length] || undefined, width: 1.1 });
  const ordered = plot.series.map((s, i) => ({ s, i })).sort((a, b) => Number(a.s.topology === subject) - Number(b.s.topology === subject));
  const mismatchNote = plot.mismatch ? ` The dotted accent line is the reported design’s mismatch-limited worst case (differential output).` : '';
  return (
    <Figure
      title="Rejection against frequency, every option"
      summary={`${rejectionSummary(plot)} Curves at nominal conditions, each up to where its differential gain has fallen 20 dB (at most 1 GHz; 10 MHz for a device card without capacitances); diamonds mark each option’s worst corner at ${f}; the dashed line is the required rejection, the solid one with the margin.${mismatchNote}`}
      legend={
        <Legend
          items={[
            ...plot.series.map((s, i) => {
              const st = style(i, s.topology);
              return { key: s.topology, sample: <LineSample stroke={st.stroke} dash={st.dash || undefined} width={st.width} />, text: `${s.name}${s.topology === subject ? ' (this report’s design)' : ''}` };
            }),
            ...(ownValues ? [{ key: 'own', sample: <LineSample stroke={ACCENT} width={2.6} />, text: `${ownValues.name} (this report’s design)` }] : []),
            ...(plot.mismatch ? [{ key: 'mismatch', sample: <LineSample stroke={ACCENT} dash="1.5 2.5" width={2} />, text: `${plot.mismatch.name}, mismatch worst case` }] : []),
            { key: 'required', sample: <LineSample stroke={SHORT} dash="5 3" />, text: `required ${formatTargetDb(plot.requiredDb)}` },
            { key: 'margin', sample: <LineSample stroke={NOTE} />, text: `with margin ${formatTargetDb(plot.requiredWithMarginDb)}` },
          ]}
        />
      }
    >
      <SvgFrame
        label={`Rejection against frequency for ${plot.series.length} options, ${formatQuantity(grid[0], 'Hz')} to ${formatQuantity(grid[grid.length - 1], 'Hz')}`}
        sx={sx}
        sy={sy}
        xTicks={decadeTicksHz(grid[0], grid[grid.length - 1])}
        yTicks={yTicks}
        xFormat={(v) => formatQuantity(v, 'Hz', 3).replace(' ', '\u00a0')}
        yFormat={(v) => String(v)}
        xTitle="Frequency"
        yTitle="Rejection, dB"
      >
        <line x1={sx(plot.specFrequencyHz)} x2={sx(plot.specFrequencyHz)} y1={PLOT_Y[0]} y2={PLOT_Y[1]} stroke={SOFT} strokeDasharray="2 2" />
        <line x1={PLOT_X[0]} x2={PLOT_X[1]} y1={sy(plot.requiredDb)} y2={sy(plot.requiredDb)} stroke={SHORT} strokeDasharray="5 3" />
        <line x1={PLOT_X[0]} x2={PLOT_X[1]} y1={sy(plot.requiredWithMarginDb)} y2={sy(plot.requiredWithMarginDb)} stroke={NOTE} />
        {ordered.map(({ s, i }) => {
          const st = style(i, s.topology);
          return <path key={s.topology} data-series={s.topology} d={linePath(grid, s.valuesDb, sx, sy)} fill="none" stroke={st.stroke} strokeOpacity={s.topology === subject ? 1 : 0.7} strokeWidth={st.width} strokeDasharray={st.dash || undefined} />;
        })}
        {ownValues && <path data-series="own-values" d={linePath(grid, ownValues.valuesDb, sx, sy)} fill="none" stroke={ACCENT} strokeWidth={2.6} />}
        {plot.mismatch && <path data-series="mismatch" d={linePath(grid, plot.mismatch.valuesDb, sx, sy)} fill="none" stroke={ACCENT} strokeWidth={2} strokeDasharray="1.5 2.5" />}
        {plot.series.map((s) =>
          s.worstAtFrequencyDb === null ? null : (
            <path
              key={`worst-${s.topology}`}
              d={`M${sx(plot.specFrequencyHz)},${sy(s.worstAtFrequencyDb) - 4}l4,4l-4,4l-4,-4z`}
              fill={s.topology === subject ? ACCENT : 'var(--plot-paper)'}
              stroke={s.topology === subject ? ACCENT : SOFT}
            />
          ),
        )}
      </SvgFrame>
    </Figure>
  );
}

interface HistogramSeries {
  key: string;
  label: string;
  counts: number[];
  look: 'bars' | 'outline';
}

function HistogramSvg({ label, edges, series, requiredDb, rangeDb }: { label: string; edges: number[]; series: HistogramSeries[]; requiredDb: number; rangeDb: [number, number] }) {
  const most = Math.max(1, ...series.flatMap((s) => s.counts));
  const xDomain = niceDomain(rangeDb[0], rangeDb[1], 6);
  const sx = linearScale(xDomain, PLOT_X);
  const yDomain = niceDomain(0, most, 4);
  const sy = linearScale(yDomain, PLOT_Y);
  return (
    <SvgFrame label={label} sx={sx} sy={sy} xTicks={niceTicks(xDomain[0], xDomain[1], 6)} yTicks={niceTicks(yDomain[0], yDomain[1], 4)} xFormat={(v) => String(v)} yFormat={(v) => String(v)} xTitle="Differential rejection, dB" yTitle="Samples">
      {series.map((s) =>
        s.look === 'bars' ? (
          <g key={s.key} data-series={s.key}>
            {s.counts.map((count, i) => (
              <rect key={i} x={sx(edges[i])} y={sy(count)} width={Math.max(0.5, sx(edges[i + 1]) - sx(edges[i]) - 0.6)} height={Math.max(0, sy(0) - sy(count))} fill={ACCENT} fillOpacity="0.45" stroke={ACCENT} strokeWidth="0.6" />
            ))}
          </g>
        ) : (
          <path key={s.key} data-series={s.key} d={stepPath(edges, s.counts, sx, sy)} fill="none" stroke="currentColor" strokeWidth="1.6" />
        ),
      )}
      <line x1={sx(requiredDb)} x2={sx(requiredDb)} y1={PLOT_Y[0]} y2={PLOT_Y[1]} stroke={SHORT} strokeWidth="1.6" strokeDasharray="5 3" />
    </SvgFrame>
  );
}

/** The engine's Monte Carlo of the reported design: its samples' rejection, with the required line. */
export function EngineMonteCarloSvg({ plot, name, requiredYieldPercent }: { plot: HistogramPlot; name: string; requiredYieldPercent: number }) {
  const edges = [plot.bars[0]?.fromDb ?? 0, ...plot.bars.map((b) => b.toDb)];
  return (
    <Figure
      title={`Monte Carlo rejection of the ${name} (the engine)`}
      summary={`${formatPercent(plot.yieldPercent)} of ${plot.samples} samples reach ${formatTargetDb(plot.requiredDb)} (${formatPercent(requiredYieldPercent)} required); 1st percentile ${formatDb(plot.percentilesDb.p1)}, median ${formatDb(plot.percentilesDb.p50)}. The last bar also counts every sample above its range; the dashed line is the required rejection.`}
    >
      <HistogramSvg label={`Histogram of ${plot.samples} Monte Carlo samples of the ${name}`} edges={edges} series={[{ key: 'engine', label: 'engine', counts: plot.bars.map((b) => b.count), look: 'bars' }]} requiredDb={plot.requiredDb} rangeDb={plot.rangeDb} />
    </Figure>
  );
}

/** A finished SPICE Monte Carlo: ngspice's runs as bars, the engine's closed form on the same draws as an outline. */
export function SpiceMonteCarloSvg({ result, name }: { result: MonteCarloVerificationResult; name: string }) {
  const plot = monteCarloPlot(result);
  if (!plot) return null;
  const counted = result.runs - result.failedRuns;
  return (
    <Figure
      title={`SPICE Monte Carlo of the ${name}: ngspice and the engine`}
      summary={`${formatPercent(result.simulated.yieldPercent)} of ngspice’s ${counted} runs reach ${formatTargetDb(result.requiredDb)} against ${formatPercent(result.predicted.yieldPercent)} by the engine’s closed form on the same draws; medians ${formatDb(result.simulated.percentilesDb.p50)} and ${formatDb(result.predicted.percentilesDb.p50)}.`}
      legend={
        <Legend
          items={[
            { key: 'sim', sample: (
                <svg viewBox="0 0 20 10" width="20" height="10" aria-hidden="true" className="inline-block shrink-0">
                  <rect x="0.5" y="0.5" width="19" height="9" fill={ACCENT} fillOpacity="0.45" stroke={ACCENT} />
                </svg>
              ), text: 'ngspice' },
            { key: 'engine', sample: <LineSample stroke="currentColor" />, text: 'engine, closed form' },
            { key: 'required', sample: <LineSample stroke={SHORT} dash="5 3" />, text: `required ${formatTargetDb(result.requiredDb)}` },
          ]}
        />
      }
    >
      <HistogramSvg
        label={`Histograms of ${counted} SPICE Monte Carlo runs and the engine's closed form for the ${name}`}
        edges={plot.binEdgesDb}
        series={[
          { key: 'simulated', label: 'ngspice', counts: plot.simulatedCounts, look: 'bars' },
          { key: 'predicted', label: 'engine', counts: plot.predictedCounts, look: 'outline' },
        ]}
        requiredDb={plot.requiredDb}
        rangeDb={plot.rangeDb}
      />
    </Figure>
  );
}
