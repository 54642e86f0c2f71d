/** The trade-off chart, lazy (components/ui/lazy-chart.tsx): uPlot loads only when a chart is first shown. */
import { lazyChartModule } from '../../../../components/ui/lazy-chart';

const lazyChart = lazyChartModule(() => import('./tradeoff-charts'));

export const TradeoffChartView = lazyChart((m) => m.TradeoffChartView);
