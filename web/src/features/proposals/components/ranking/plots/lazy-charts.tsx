/**
 * The charts, lazy (components/ui/lazy-chart.tsx): uPlot and its stylesheet load only when a plot
 * is first shown, in their own chunk. A failed load leaves a sentence in place of the plot, not a
 * broken page.
 */
import { lazyChartModule } from '../../../../../components/ui/lazy-chart';

/** One import shared by the three charts. */
const lazyChart = lazyChartModule(() => import('./charts'));

export const RejectionChart = lazyChart((m) => m.RejectionChart);
export const HistogramChart = lazyChart((m) => m.HistogramChart);
export const TemperatureChart = lazyChart((m) => m.TemperatureChart);
