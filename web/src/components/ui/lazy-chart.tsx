/**
 * Charts loaded lazily: a chart module (uPlot and its stylesheet) loads only when one of its
 * plots is first shown, in its own chunk, once for all its charts. A plot is first shown when its
 * place comes near the viewport or the browser is idle (deferred.tsx), so drawing never holds up
 * the page's first paint, and every plot is there once the page settles. A failed load is
 * forgotten so a later render can retry, and leaves a sentence in place of the plot, not a broken
 * page.
 */
import { lazy, type ComponentType } from 'react';
import { WhenNearView } from './deferred';
import { Loading } from './feedback';

function Unavailable() {
  return <p className="py-6 text-sm text-ink-soft dark:text-night-ink-soft">The plot could not be loaded; reload the page to try again.</p>;
}

/**
 * `load` is the caller's own `() => import('./charts')`, so the bundler splits that module off;
 * the function returned makes one lazy component per chart picked from it.
 */
export function lazyChartModule<M>(load: () => Promise<M>) {
  let loading: Promise<M> | null = null;
  const loaded = (): Promise<M> =>
    (loading ??= load().catch((error: unknown) => {
      loading = null;
      throw error;
    }));
  return function lazyChart<P extends object>(pick: (module: M) => ComponentType<P>) {
    const Chart = lazy(async () => {
      try {
        return { default: pick(await loaded()) };
      } catch {
        return { default: Unavailable as ComponentType<P> };
      }
    });
    // The same words as the figure's own loading state, so the wait reads as one.
    return function DeferredChart(props: P) {
      return (
        <WhenNearView placeholder={<Loading what="Drawing the plot" />}>
          <Chart {...props} />
        </WhenNearView>
      );
    };
  };
}
