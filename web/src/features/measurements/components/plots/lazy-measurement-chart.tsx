/**
 * The measurement chart, lazy, as the ranking's and the SPICE check's are
 * (components/ui/lazy-chart.tsx): uPlot and its stylesheet load only when a plot is first shown.
 * A failed load leaves a sentence in place of the plot, not a broken page.
 */
import { lazyChartModule } from '../../../../components/ui/lazy-chart';

export const MeasurementChart = lazyChartModule(() => import('./measurement-chart'))((m) => m.MeasurementChart);
