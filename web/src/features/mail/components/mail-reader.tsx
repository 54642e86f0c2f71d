import { useRef, useState } from 'react';
import { EmptyState } from '../../../components/ui/feedback';
import { Sheet } from '../../../components/ui/sheet';
import { cn } from '../../../lib/cn';
import type { ReceivedMail } from '#shared/api/admin';
import { When } from '../../../components/ui/when';
import { formatDateTime } from '../../../lib/dates';

const soft = 'text-ink-soft dark:text-night-ink-soft';

/** Wide enough for the list and the message side by side (Tailwind's lg, as the grid below). */
const SIDE_BY_SIDE = '(min-width: 64rem)';

/**
 * The messages on the left, newest first; the one picked (the newest at first) read on the right.
 * On a narrow screen the message comes after the whole list, so picking one scrolls to it.
 */
export function MailReader({ messages }: { messages: ReceivedMail[] }) {
  const [pickedId, setPickedId] = useState<number | null>(null);
  const reader = useRef<HTMLDivElement>(null);
  const pick = (id: number) => {
    setPickedId(id);
    if (window.matchMedia?.(SIDE_BY_SIDE).matches === false) requestAnimationFrame(() => reader.current?.scrollIntoView({ block: 'start' }));
  };
  if (messages.length === 0) {
    return (
      <EmptyState title="No messages yet">
        Workflow e-mails land here once a proposal is ranked, decided or reviewed. When Longtail sends through a real mail server (LONGTAIL_SMTP_URL), they go
        there instead and do not show here.
      </EmptyState>
    );
  }
  const open = messages.find((m) => m.id === pickedId) ?? messages[0];
  return (
    <div className="grid grid-cols-[minmax(0,1fr)] items-start gap-6 lg:grid-cols-[24rem_minmax(0,1fr)]">
      <nav aria-label="Messages">
        <ul className="divide-y divide-rule overflow-hidden rounded-lg border border-rule bg-sheet dark:divide-night-rule dark:border-night-rule dark:bg-night-sheet">
          {messages.map((message) => {
            const current = message.id === open.id;
            return (
              <li key={message.id}>
                <button
                  type="button"
                  aria-current={current ? 'true' : undefined}
                  onClick={() => pick(message.id)}
                  className={cn('block w-full px-3 py-2 text-left text-sm hover:bg-paper dark:hover:bg-night', current && 'bg-fern-soft dark:bg-night')}
                >
                  <span className="line-clamp-2 font-medium break-words">{message.subject || '(no subject)'}</span>
                  <span className={cn('flex justify-between gap-2 text-xs', soft)}>
                    <span className="truncate">To {message.to.join(', ')}</span>
                    <When iso={message.at} />
                  </span>
                </button>
              </li>
            );
          })}
        </ul>
      </nav>
      <div ref={reader} className="min-w-0 scroll-mt-4">
        <Sheet aria-label="Message" title={open.subject || '(no subject)'}>
          <dl className="mb-4 grid grid-cols-[5rem_minmax(0,1fr)] gap-y-1 text-sm">
            <dt className={soft}>To</dt>
            <dd>{open.to.join(', ')}</dd>
            <dt className={soft}>From</dt>
            <dd>{open.from ?? '—'}</dd>
            <dt className={soft}>Received</dt>
            <dd>
              <time dateTime={open.at}>{formatDateTime(open.at, { seconds: true })}</time>
            </dd>
          </dl>
          <pre className="font-sans text-sm leading-relaxed whitespace-pre-wrap [overflow-wrap:anywhere]">{open.text}</pre>
        </Sheet>
      </div>
    </div>
  );
}
