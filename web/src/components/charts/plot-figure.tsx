import { Suspense, useId, type ReactNode } from 'react';
import { Loading } from '../ui/feedback';

/** A plot with its title and a one-sentence summary (what a screen reader hears instead of the canvas). */
export function PlotFigure({ title, summary, children }: { title: string; summary: string; children: ReactNode }) {
  const id = useId();
  return (
    <figure aria-labelledby={`${id}-title`} aria-describedby={`${id}-summary`} className="min-w-0">
      <figcaption className="mb-2">
        <h3 id={`${id}-title`} className="text-sm font-medium">
          {title}
        </h3>
        <p id={`${id}-summary`} className="text-xs text-ink-soft dark:text-night-ink-soft">
          {summary}
        </p>
      </figcaption>
      <Suspense fallback={<Loading what="Drawing the plot" />}>{children}</Suspense>
    </figure>
  );
}
