import type { ReactNode } from 'react';
import { cn } from '../../../../lib/cn';
import type { FigureStanding } from '../../lib/option-rows';

const STANDING: Record<FigureStanding, { glyph: string; words: string; className: string }> = {
  short: { glyph: '✕', words: 'short of its check', className: 'text-short dark:text-short-bright font-medium' },
  note: { glyph: '!', words: 'advisory check not met', className: 'text-note dark:text-note-bright' },
};

/** Splits "2.32 kΩ" into number and unit so the unit can be set softer. */
function NumberAndUnit({ text, soften }: { text: string; soften: boolean }) {
  const space = text.lastIndexOf(' ');
  if (space < 0) return <>{text}</>;
  return (
    <>
      {text.slice(0, space)}
      <span className={cn('ml-0.5 text-[0.85em]', soften && 'opacity-70')}>{text.slice(space + 1)}</span>
    </>
  );
}

/** One table figure: right-aligned, tabular, with a glyph and words when its check falls short. */
export function FigureCell({ text, standing, extra }: { text: string | null; standing?: FigureStanding; extra?: ReactNode }) {
  if (text === null) return <span className="text-ink-soft dark:text-night-ink-soft">—</span>;
  const look = standing ? STANDING[standing] : null;
  return (
    <span className={cn('whitespace-nowrap tabular-nums', look?.className)}>
      {look && (
        <span aria-hidden="true" className="mr-1">
          {look.glyph}
        </span>
      )}
      <NumberAndUnit text={text} soften={!look} />
      {look && <span className="sr-only"> ({look.words})</span>}
      {extra}
    </span>
  );
}
