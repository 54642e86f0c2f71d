import type { KeyboardEvent, ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { SearchHit } from '#shared/api/search';
import { HitSummary } from '../../../components/search/hit-summary';
import type { PersonRoles } from '#shared/workflow/roles';
import { hitHref } from '../../../lib/search-queries';

/** Up and down arrows move between the hits of the whole results area (each hit is one link). */
export function onResultsKeyDown(event: KeyboardEvent<HTMLElement>) {
  if (event.key !== 'ArrowDown' && event.key !== 'ArrowUp') return;
  const links = [...event.currentTarget.querySelectorAll<HTMLAnchorElement>('a[data-search-hit]')];
  const at = links.indexOf(document.activeElement as HTMLAnchorElement);
  if (at === -1) return;
  event.preventDefault();
  links[Math.min(links.length - 1, Math.max(0, at + (event.key === 'ArrowDown' ? 1 : -1)))].focus();
}

/** Hits as links, best match first. */
export function HitList({ hits, viewer, label }: { hits: SearchHit[]; viewer: PersonRoles & { id: number }; label: string }): ReactNode {
  return (
    <ol aria-label={label}>
      {hits.map((hit) => (
        <li key={`${hit.kind}-${hit.id}`} className="border-b border-rule/70 last:border-b-0 dark:border-night-rule/70">
          <Link data-search-hit to={hitHref(hit, viewer)} className="block rounded-sm px-1.5 py-2 hover:bg-paper dark:hover:bg-night">
            <HitSummary hit={hit} titleClassName="text-fern dark:text-fern-bright" />
          </Link>
        </li>
      ))}
    </ol>
  );
}
