/** A uPlot chart in a React box: built on mount, rebuilt when its options or data change, resized with its box. */
import { useEffect, useMemo, useRef, useState } from 'react';
import uPlot from 'uplot';
import { chartTheme, type ChartTheme } from './chart-theme';

/** The plot colours of the current theme (the `dark` class on <html>), following changes. */
export function useChartTheme(): ChartTheme {
  const [dark, setDark] = useState(() => document.documentElement.classList.contains('dark'));
  useEffect(() => {
    const observer = new MutationObserver(() => setDark(document.documentElement.classList.contains('dark')));
    observer.observe(document.documentElement, { attributes: true, attributeFilter: ['class'] });
    return () => observer.disconnect();
  }, []);
  return useMemo(() => chartTheme(dark), [dark]);
}

/** The index of the data point under the cursor (null when the cursor is off the plot), and the hook that tracks it. */
export function useCursorIndex() {
  const [index, setIndex] = useState<number | null>(null);
  const hook = useMemo(() => (u: uPlot) => setIndex(u.cursor.idx ?? null), []);
  return [index, hook] as const;
}

export type ChartOptions = Omit<uPlot.Options, 'width' | 'height'>;

export function UplotBox({ options, data, height }: { options: ChartOptions; data: uPlot.AlignedData; height: number }) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const element = box.current;
    if (!element) return;
    const widthOf = () => Math.max(240, Math.floor(element.clientWidth));
    const chart = new uPlot({ ...options, legend: { show: false }, width: widthOf(), height }, data, element);
    const observer = new ResizeObserver(() => chart.setSize({ width: widthOf(), height }));
    observer.observe(element);
    return () => {
      observer.disconnect();
      chart.destroy();
    };
  }, [options, data, height]);
  // Drawn on a canvas: the figure's caption carries the words for screen readers.
  return <div ref={box} aria-hidden="true" className="w-full" />;
}
