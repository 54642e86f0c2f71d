/**
 * Uploading one text file: a button-styled picker that hands the chosen file on (and clears
 * itself, so the same file can be chosen again), and the refusal of a file with each problem on
 * its own line, numbered by the file's line where the server names one. Nothing of a refused
 * file is stored.
 */
import { useId, type ChangeEvent } from 'react';
import { ApiError } from '../../lib/api';
import { cn } from '../../lib/cn';

/** `srLabel`: the control's name for assistive technology when the visible label is short ("Replace…" in a row of cards). */
export function FileUploadButton({ label, srLabel, accept, pending, onFile }: { label: string; srLabel?: string; accept: string; pending: boolean; onFile: (file: File) => void }) {
  const inputId = useId();
  const onChange = (event: ChangeEvent<HTMLInputElement>) => {
    const file = event.target.files?.[0];
    event.target.value = '';
    if (file) onFile(file);
  };
  return (
    <div className="rounded-md has-[input:focus-visible]:ring-2 has-[input:focus-visible]:ring-fern">
      <label
        htmlFor={inputId}
        className="inline-flex cursor-pointer items-center rounded-md border border-rule bg-sheet px-3 py-1.5 text-sm font-medium hover:bg-paper dark:border-night-rule dark:bg-night-sheet dark:hover:bg-night"
      >
        {pending ? 'Reading the file…' : label}
      </label>
      <input id={inputId} type="file" accept={accept} aria-label={srLabel} className="sr-only" disabled={pending} onChange={onChange} />
    </div>
  );
}

/** The server's refusal of an uploaded file: its message, then its problems with their line numbers (none for a file too large). */
export function UploadProblems({ error, className }: { error: Error; className?: string }) {
  const details = error instanceof ApiError && error.code !== 'file-too-large' ? error.details : [];
  return (
    <div role="alert" className={cn('rounded-md border border-short/40 bg-short-soft p-3 text-sm text-short dark:bg-short/20 dark:text-short-bright', className)}>
      <p className="font-medium">
        <span aria-hidden="true">✕ </span>
        {error.message}
      </p>
      {details.length > 0 && (
        <ul className="mt-1.5 list-none space-y-0.5">
          {details.map((detail, index) => (
            <li key={index}>
              {detail.line !== undefined && <span className="font-medium tabular-nums">Line {detail.line}: </span>}
              {detail.message}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
