/**
 * The SPICE check's charts, lazy, as the ranking's are (components/ui/lazy-chart.tsx): uPlot and
 * its stylesheet load only when a plot is first shown, in their own chunk. A failed load leaves a
 * sentence in place of the plot, not a broken page.
 */
import { lazyChartModule } from '../../../../../components/ui/lazy-chart';

/** One import shared by both charts. */
const lazyChart = lazyChartModule(() => import('./verification-charts'));

export const RejectionComparisonChart = lazyChart((m) => m.RejectionComparisonChart);
export const MonteCarloComparisonChart = lazyChart((m) => m.MonteCarloComparisonChart);
