/**
 * The SPICE check's charts, lazy, as the ranking's are (ranking/plots/lazy-charts.tsx): uPlot and
 * its stylesheet load only when a plot is first shown, in their own chunk. A failed load leaves a
 * sentence in place of the plot, not a broken page.
 */
import { lazy, type ComponentType } from 'react';

type ChartsModule = typeof import('./verification-charts');
/** One import shared by both charts; forgotten after a failure so a later render can retry. */
let loading: Promise<ChartsModule> | null = null;
const charts = (): Promise<ChartsModule> =>
  (loading ??= import('./verification-charts').catch((error: unknown) => {
    loading = null;
    throw error;
  }));

function lazyChart<P extends object>(pick: (module: ChartsModule) => ComponentType<P>) {
  return lazy(async () => {
    try {
      return { default: pick(await charts()) };
    } catch {
      const Unavailable = () => <p className="py-6 text-sm text-ink-soft dark:text-night-ink-soft">The plot could not be loaded; reload the page to try again.</p>;
      return { default: Unavailable as ComponentType<P> };
    }
  });
}

export const RejectionComparisonChart = lazyChart((m) => m.RejectionComparisonChart);
export const MonteCarloComparisonChart = lazyChart((m) => m.MonteCarloComparisonChart);
