import type { SearchHit } from '#shared/api/search';
import { cn } from '../../lib/cn';
import { StateBadge } from '../ui/state-badge';
import { MarkedText } from './marked-text';

const soft = 'text-ink-soft dark:text-night-ink-soft';

/** Where the hit lives, in words: a spec's or proposal's project, a project the person is in. */
function placeOf(hit: SearchHit): string | null {
  if (!hit.project) return null;
  return hit.kind === 'person' ? `in ${hit.project.name}` : hit.project.name;
}

/**
 * One hit as the box and the results page show it: its title with the matched words marked (a
 * proposal's state beside it), where it lives, and the line that says why it matched.
 */
export function HitSummary({ hit, compact = false, titleClassName }: { hit: SearchHit; compact?: boolean; titleClassName?: string }) {
  const place = placeOf(hit);
  return (
    <div className="min-w-0">
      <p className="flex flex-wrap items-center gap-x-2 gap-y-0.5">
        <span className={cn('min-w-0 break-words', compact ? 'text-sm' : 'font-medium', titleClassName)}>
          <MarkedText pieces={hit.title} />
        </span>
        {hit.state && <StateBadge state={hit.state} />}
      </p>
      {place && <p className={cn('truncate text-xs', soft)}>{place}</p>}
      {hit.excerpt && (
        <p className={cn('text-xs break-words', soft, compact ? 'line-clamp-1' : 'line-clamp-2')}>
          <MarkedText pieces={hit.excerpt} />
        </p>
      )}
    </div>
  );
}
