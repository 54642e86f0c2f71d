/**
 * The versions of a spec as a timeline, newest first: who saved each, when, and the note they
 * left. Comparing is a sentence with two choices ("the changes made in version 4 since version
 * 2"), and each version offers its own changes since the one before it in one press.
 */
import { useId } from 'react';
import type { SpecVersion } from '#shared/api/specs';
import { cn } from '../../../lib/cn';
import { When } from './when';

export interface VersionPickerProps {
  versions: readonly SpecVersion[];
  authorName: (userId: number) => string;
  /** The older side of the comparison. */
  from: number;
  /** The newer side of the comparison. */
  to: number;
  onPick: (from: number, to: number) => void;
}

const SELECT = 'min-w-0 rounded-md border border-rule bg-sheet px-2 py-1.5 font-medium tabular-nums dark:border-night-rule dark:bg-night';

/** "Show the changes made in version [to] since version [from]": two choices in one sentence. */
export function CompareSentence({ versions, from, to, onPick }: Omit<VersionPickerProps, 'authorName'>) {
  const id = useId();
  const numbers = [...versions].map((v) => v.version).sort((a, b) => b - a);
  return (
    <form aria-label="Versions to compare" onSubmit={(e) => e.preventDefault()} className="flex flex-wrap items-center gap-x-2 gap-y-2 text-sm">
      <label htmlFor={`${id}-to`}>Show the changes made in</label>
      <select id={`${id}-to`} className={SELECT} value={to} onChange={(e) => onPick(from, Number(e.target.value))}>
        {numbers.map((n) => (
          <option key={n} value={n}>
            version {n}
          </option>
        ))}
      </select>
      <label htmlFor={`${id}-from`}>since</label>
      <select id={`${id}-from`} className={SELECT} value={from} onChange={(e) => onPick(Number(e.target.value), to)}>
        {numbers.map((n) => (
          <option key={n} value={n}>
            version {n}
          </option>
        ))}
      </select>
    </form>
  );
}

export function VersionPicker({ versions, authorName, from, to, onPick }: VersionPickerProps) {
  const newestFirst = [...versions].sort((a, b) => b.version - a.version);
  const oldest = newestFirst.at(-1)?.version;
  return (
    <ol aria-label="Versions, newest first" className="relative space-y-3 border-l-2 border-rule pl-4 dark:border-night-rule">
      {newestFirst.map((v) => {
        const side = v.version === to ? 'newer side' : v.version === from ? 'older side' : null;
        return (
          <li key={v.id} className="relative">
            <span
              aria-hidden="true"
              className={cn(
                'absolute top-1.5 -left-[1.4rem] h-3 w-3 rounded-sm border-2',
                side ? 'border-fern bg-fern dark:border-fern-bright dark:bg-fern-bright' : 'border-rule bg-sheet dark:border-night-rule dark:bg-night-sheet',
              )}
            />
            <div className={cn('rounded-md px-3 py-2', side ? 'bg-fern-soft/50 dark:bg-night' : '')}>
              <p className="flex flex-wrap items-baseline gap-x-2">
                <span className="font-medium tabular-nums">Version {v.version}</span>
                {side && <span className="text-xs font-medium text-fern dark:text-fern-bright">compared: {side}</span>}
              </p>
              <p className="truncate text-xs text-ink-soft dark:text-night-ink-soft" title={v.title}>
                {v.title}
              </p>
              <p className="text-xs text-ink-soft dark:text-night-ink-soft">
                {authorName(v.createdById)} · <When at={v.createdAt} />
              </p>
              {v.note && <p className="mt-1 text-sm break-words whitespace-pre-line">“{v.note}”</p>}
              {v.version !== oldest && !(from === v.version - 1 && to === v.version) && (
                <button type="button" className="mt-1 text-sm text-fern underline dark:text-fern-bright" onClick={() => onPick(v.version - 1, v.version)}>
                  What version {v.version} changed
                </button>
              )}
            </div>
          </li>
        );
      })}
    </ol>
  );
}
