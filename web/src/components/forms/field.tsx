import { useId, type InputHTMLAttributes, type ReactNode } from 'react';
import { cn } from '../../lib/cn';

/** First letter up: the server says "must be …", the field shows "Must be …". */
const sentence = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

/** A labelled input with its hint and its error beside it, both read out with the field. */
export function Field({ label, error, hint, ...input }: InputHTMLAttributes<HTMLInputElement> & { label: string; error?: string; hint?: ReactNode }) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  return (
    <div className="text-sm">
      <label htmlFor={id} className="mb-1 block font-medium">
        {label}
      </label>
      <input
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={cn(error && errorId, hint && hintId) || undefined}
        className={cn(
          'w-full rounded-md border bg-sheet px-3 py-1.5 dark:bg-night',
          error ? 'border-short dark:border-short-bright' : 'border-rule dark:border-night-rule',
        )}
        {...input}
      />
      {error && (
        <p id={errorId} className="mt-1 text-xs text-short dark:text-short-bright">
          <span aria-hidden="true">✕ </span>
          {sentence(error)}
        </p>
      )}
      {hint && (
        <div id={hintId} className="mt-1 text-xs text-ink-soft dark:text-night-ink-soft">
          {hint}
        </div>
      )}
    </div>
  );
}
