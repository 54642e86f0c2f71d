import { useEffect, useId, useRef, type KeyboardEvent } from 'react';
import { Button } from '../../../../components/ui/button';
import type { Shortfall } from './use-full-check';

const SITUATION: Record<Exclude<Shortfall['kind'], 'short'>, string> = {
  unchecked: 'These values have not been through the full check yet.',
  checking: 'The full check of these values is still running.',
  'not-completed': 'The full check of these values did not complete.',
};

/**
 * A second thought before recording an override that is unchecked or short on a blocking rule;
 * confirming records it all the same (the reason is what explains it to the reviewer).
 * Escape or "Keep editing" dismisses it.
 */
export function OverrideConfirmation({ shortfall, onConfirm, onCancel, pending }: { shortfall: Shortfall; onConfirm: () => void; onCancel: () => void; pending: boolean }) {
  const id = useId();
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => ref.current?.focus(), []);
  const onKeyDown = (event: KeyboardEvent) => {
    if (event.key !== 'Escape') return;
    event.preventDefault();
    onCancel();
  };
  return (
    <div
      ref={ref}
      tabIndex={-1}
      role="alertdialog"
      aria-modal="false"
      aria-labelledby={`${id}-title`}
      aria-describedby={`${id}-more`}
      onKeyDown={onKeyDown}
      className="rounded-md border border-note/40 bg-note-soft p-3 text-sm text-ink outline-none focus-visible:ring-2 focus-visible:ring-note dark:bg-note/20 dark:text-night-ink"
    >
      <p id={`${id}-title`} className="font-medium">
        {shortfall.kind === 'short' ? `This override falls short on: ${shortfall.rules.join('; ')}.` : SITUATION[shortfall.kind]} Record it anyway?
      </p>
      <p id={`${id}-more`} className="mt-1 text-ink-soft dark:text-night-ink-soft">
        The server checks the values again when it records them, and the reviewer reads your reason beside its verdict.
        {shortfall.kind !== 'short' && ' You can keep editing and run the full check first.'}
      </p>
      <div className="mt-2 flex flex-wrap gap-2">
        <Button onClick={onConfirm} disabled={pending}>
          Record it anyway
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Keep editing
        </Button>
      </div>
    </div>
  );
}
