import { useQueries } from '@tanstack/react-query';
import type { ProposalState } from '#shared/workflow/proposal-states';
import type { Role } from '#shared/workflow/roles';
import { STATE_LABELS, StateGlyph } from '../../../components/ui/state-badge';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { cn } from '../../../lib/cn';
import { projectProposalCountQuery } from '../api/project-queries';
import type { ProposalFilter } from '../utils/proposal-filter';

/** The states each role acts on, and how to say a count of them. */
const WAITING: Partial<Record<Role, { status: ProposalState; say: (n: number) => string }[]>> = {
  designer: [
    { status: 'ranked', say: (n) => `${n} ${n === 1 ? 'proposal waits' : 'proposals wait'} for your decision` },
    { status: 'returned', say: (n) => `${n} sent back for rework by a reviewer, to decide again` },
  ],
  reviewer: [{ status: 'decided', say: (n) => `${n} ${n === 1 ? 'decision waits' : 'decisions wait'} for your review` }],
};

const NO_QUEUE: Record<Role, string> = {
  admin: 'You manage who works on this project and the role each holds here: under “People on this project”.',
  requirements: 'Write or revise the specs; from a spec’s page, ask the engine for a proposal.',
  designer: '',
  reviewer: '',
};

/** "What needs you": the counts of proposals waiting for the role held in this project, each a shortcut to the filter (nothing without a role here). */
export function NeedsYou({ projectId, role, onShow }: { projectId: number; role: Role | null; onShow: (status: ProposalFilter) => void }) {
  const queue = (role && WAITING[role]) ?? [];
  const counts = useQueries({ queries: queue.map((q) => projectProposalCountQuery(projectId, q.status)) });
  const frame = 'mb-6 flex flex-wrap items-center gap-x-4 gap-y-2 rounded-lg border-l-4 border-fern bg-fern-soft/60 px-4 py-2.5 text-sm dark:bg-night-sheet';
  const heading = <h2 className="font-medium text-fern dark:text-fern-bright">What needs you</h2>;
  const everywhere = (
    <Link to={paths.waiting.href()} className="ml-auto text-xs text-fern underline dark:text-fern-bright">
      What waits for you in every project
    </Link>
  );
  if (role === null) return null;
  if (queue.length === 0)
    return (
      <section aria-label="What needs you" className={frame}>
        {heading}
        <p>{NO_QUEUE[role]}</p>
      </section>
    );
  const failed = counts.find((c) => c.isError);
  const loading = counts.some((c) => c.isPending);
  const waiting = queue.map((q, i) => ({ ...q, count: counts[i]?.data ?? 0 })).filter((q) => q.count > 0);
  return (
    <section aria-label="What needs you" aria-busy={loading} className={frame}>
      {heading}
      {failed ? (
        <p role="alert" className="text-short dark:text-short-bright">
          The counts could not be fetched: {failed.error?.message}{' '}
          <button type="button" className="underline" onClick={() => counts.forEach((c) => c.isError && c.refetch())}>
            Try again
          </button>
        </p>
      ) : loading ? (
        <p className="text-ink-soft dark:text-night-ink-soft">Counting…</p>
      ) : waiting.length === 0 ? (
        <p>
          <span aria-hidden="true" className="mr-1">
            ✓
          </span>
          Nothing waits for you here right now.
        </p>
      ) : (
        <ul className="flex flex-wrap gap-2">
          {waiting.map((q) => (
            <li key={q.status}>
              <button
                type="button"
                onClick={() => onShow(q.status)}
                className={cn('inline-flex items-center gap-1.5 rounded-sm border border-l-[3px] border-rule bg-sheet px-3 py-1 hover:underline dark:border-night-rule dark:bg-night', STATE_LABELS[q.status].className)}
              >
                <StateGlyph glyph={STATE_LABELS[q.status].glyph} />
                <span className="font-medium tabular-nums">{q.say(q.count)}</span>
              </button>
            </li>
          ))}
        </ul>
      )}
      {everywhere}
    </section>
  );
}
