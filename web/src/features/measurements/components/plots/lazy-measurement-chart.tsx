/**
 * The measurement chart, lazy, as the ranking's and the SPICE check's are: uPlot and its
 * stylesheet load only when a plot is first shown. A failed load leaves a sentence in place of
 * the plot, not a broken page.
 */
import { lazy, type ComponentType } from 'react';

type ChartModule = typeof import('./measurement-chart');
type ChartProps = Parameters<ChartModule['MeasurementChart']>[0];

export const MeasurementChart = lazy<ComponentType<ChartProps>>(async () => {
  try {
    const module: ChartModule = await import('./measurement-chart');
    return { default: module.MeasurementChart };
  } catch {
    const Unavailable = () => <p className="py-6 text-sm text-ink-soft dark:text-night-ink-soft">The plot could not be loaded; reload the page to try again.</p>;
    return { default: Unavailable as ComponentType<ChartProps> };
  }
});
