import { useQuery, useSuspenseQuery } from '@tanstack/react-query';
import { Link, useNavigate } from 'react-router-dom';
import { SEARCH_KINDS, type SearchAnswer, type SearchKind } from '#shared/api/search';
import { EmptyState, ErrorPanel, Loading } from '../../../components/ui/feedback';
import { Pagination } from '../../../components/ui/pagination';
import { meQuery } from '../../../lib/auth-queries';
import { cn } from '../../../lib/cn';
import { SEARCH_KIND_WORDS, searchHref, searchQuery } from '../../../lib/search-queries';
import type { SearchView } from '../lib/search-view';
import { HitList, onResultsKeyDown } from './hit-list';

/** Hits of each kind on the page of every kind, and on one kind's pages. */
export const OVERVIEW_SIZE = 5;
export const KIND_PAGE_SIZE = 20;

/** The results page's query for a view. */
export const resultsQuery = (view: SearchView) => searchQuery({ q: view.q, kind: view.kind, page: view.page, pageSize: view.kind ? KIND_PAGE_SIZE : OVERVIEW_SIZE });

const HOW_TO =
  'Words are matched whole, the last one also as the start of a longer word; a number and its unit go together (“80 dB”, “4.7 kΩ”). Search for a name, a value, a proposal number (“#42”) or state (“awaiting review”).';

/** Every kind and each one alone, with their counts: the current one marked. */
function KindSwitch({ q, answer, current }: { q: string; answer: SearchAnswer; current: SearchKind | null }) {
  const total = SEARCH_KINDS.reduce((sum, kind) => sum + answer.counts[kind], 0);
  const chip = (selected: boolean) =>
    cn(
      'inline-flex items-baseline gap-1.5 rounded-sm border-b-2 px-2 py-1 text-sm whitespace-nowrap',
      selected ? 'border-fern font-medium text-ink dark:border-fern-bright dark:text-night-ink' : 'border-transparent text-ink-soft hover:text-ink dark:text-night-ink-soft dark:hover:text-night-ink',
    );
  return (
    <nav aria-label="Kinds of results" className="mb-4 flex flex-wrap gap-x-1 gap-y-1 border-b border-rule dark:border-night-rule">
      <Link to={searchHref(q)} aria-current={current === null ? 'page' : undefined} className={chip(current === null)}>
        Everything <span className="text-xs tabular-nums">{total}</span>
      </Link>
      {SEARCH_KINDS.filter((kind) => answer.counts[kind] > 0 || kind === current).map((kind) => (
        <Link key={kind} to={searchHref(q, kind)} aria-current={current === kind ? 'page' : undefined} className={chip(current === kind)}>
          {SEARCH_KIND_WORDS[kind].title} <span className="text-xs tabular-nums">{answer.counts[kind]}</span>
        </Link>
      ))}
    </nav>
  );
}

/** The answer to the address's query: every kind's best few with a way to the rest, or one kind paged. Arrow keys move between hits. */
export function SearchResults({ view }: { view: SearchView }) {
  const { data: user } = useSuspenseQuery(meQuery());
  const navigate = useNavigate();
  const answer = useQuery({ ...resultsQuery(view), enabled: view.q !== '' });
  if (!user) return null;
  if (view.q === '') {
    return (
      <EmptyState title="Type what you are looking for in the search box at the top">
        Press <kbd className="rounded-sm border border-rule px-1 font-mono dark:border-night-rule">/</kbd> to get there from anywhere. {HOW_TO}
      </EmptyState>
    );
  }
  if (answer.isPending) return <Loading what="Searching" />;
  if (answer.isError) return <ErrorPanel error={answer.error} retry={() => void answer.refetch()} />;
  const data = answer.data;
  const total = SEARCH_KINDS.reduce((sum, kind) => sum + data.counts[kind], 0);
  if (total === 0) {
    return <EmptyState title={data.words.length ? `Nothing you can see matches “${view.q}”` : `“${view.q}” holds no word to search for`}>{HOW_TO}</EmptyState>;
  }
  const busy = answer.isPlaceholderData;
  return (
    <div onKeyDown={onResultsKeyDown} aria-busy={busy} className={cn('transition-opacity', busy && 'opacity-60')}>
      <KindSwitch q={view.q} answer={data} current={view.kind} />
      {view.kind ? (
        <section aria-label={SEARCH_KIND_WORDS[view.kind].title}>
          <HitList hits={data.groups[0]?.items ?? []} viewer={user} label={SEARCH_KIND_WORDS[view.kind].title} />
          {data.counts[view.kind] > KIND_PAGE_SIZE && (
            <Pagination page={view.page} pageSize={KIND_PAGE_SIZE} total={data.counts[view.kind]} onPage={(page) => navigate(searchHref(view.q, view.kind, page))} label={`${SEARCH_KIND_WORDS[view.kind].title}: pages`} />
          )}
        </section>
      ) : (
        <div className="grid gap-6">
          {data.groups.map((group) => {
            const words = SEARCH_KIND_WORDS[group.kind];
            return (
              <section key={group.kind} aria-labelledby={`results-${group.kind}`} data-results={group.kind}>
                <h2 id={`results-${group.kind}`} className="mb-1 flex items-baseline gap-2 border-l-[3px] border-fern pl-2 text-sm font-medium dark:border-fern-bright">
                  {words.title}
                  <span className="rounded-sm bg-sheet px-1.5 text-xs tabular-nums dark:bg-night-sheet">
                    <span className="sr-only">: </span>
                    {group.total}
                  </span>
                </h2>
                <HitList hits={group.items} viewer={user} label={words.title} />
                {group.total > group.items.length && (
                  <Link to={searchHref(view.q, group.kind)} className="mt-1 inline-block text-sm text-fern hover:underline dark:text-fern-bright">
                    All {words.count(group.total)} <span aria-hidden="true">→</span>
                  </Link>
                )}
              </section>
            );
          })}
        </div>
      )}
    </div>
  );
}
