import { useQuery } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { Link } from 'react-router-dom';
import type { Proposal, ProposalSummary } from '#shared/api/proposals';
import type { TopologyId } from '#shared/engine/types';
import { STATE_WORDS } from '#shared/workflow/proposal-states';
import { Sheet } from '../../../../components/ui/sheet';
import { paths } from '../../../../config/paths';
import { topologyName } from '../../../../lib/topology-names';
import { recentProposalsQuery } from '../../api/proposal-queries';
import { compareQuery } from '../../lib/compare-address';

const FIELD = 'min-w-0 max-w-full rounded-md border border-rule bg-sheet px-2 py-1 text-sm dark:border-night-rule dark:bg-night-sheet';
const GO = 'rounded-md border border-fern bg-fern px-2.5 py-1 text-sm font-medium whitespace-nowrap text-white hover:bg-fern/90 dark:border-fern-bright dark:bg-fern-bright dark:text-night';

/** The address of this proposal's option beside another proposal: an earlier version of the same spec on side A (before, then after). */
function beside(proposal: Proposal, other: ProposalSummary, tail: string): string {
  const otherFirst = other.specId === proposal.specId && (other.specVersionNumber ?? Infinity) < proposal.specVersion.version;
  return compareQuery(otherFirst ? { a: other.id, b: proposal.id, tailA: tail, tailB: tail } : { a: proposal.id, b: other.id, tailA: tail, tailB: tail });
}

/**
 * The ways into the side-by-side view from a proposal: two of its options, or one of them beside
 * another proposal of the project (the same spec's other rankings first).
 */
export function ComparePicker({ proposal, selected }: { proposal: Proposal; selected: TopologyId | null }) {
  const options = proposal.result.options;
  const first = selected ?? options[0]?.topology ?? null;
  const [tailA, setTailA] = useState<string | null>(null);
  const [tailB, setTailB] = useState<string | null>(null);
  const [other, setOther] = useState<number | null>(null);
  const a = tailA ?? first;
  const b = tailB ?? options.find((o) => o.topology !== a)?.topology ?? null;
  const rankings = useQuery(recentProposalsQuery(proposal.projectId));
  const others = (rankings.data?.items ?? []).filter((p) => p.id !== proposal.id).sort((x, y) => Number(y.specId === proposal.specId) - Number(x.specId === proposal.specId));
  const otherId = other ?? others[0]?.id ?? null;
  const id = useId();
  if (!a) return null;
  return (
    <Sheet title="Side by side" aria-label="Side by side" id="side-by-side">
      <div className="space-y-3 text-sm">
        {b && (
          <div className="flex flex-wrap items-center gap-2">
            <label htmlFor={`${id}-a`}>Compare</label>
            <select id={`${id}-a`} value={a} onChange={(e) => setTailA(e.target.value)} className={FIELD}>
              {options.map((o) => (
                <option key={o.topology} value={o.topology}>
                  {topologyName(o.topology)}
                </option>
              ))}
            </select>
            <label htmlFor={`${id}-b`}>with</label>
            <select id={`${id}-b`} value={b} onChange={(e) => setTailB(e.target.value)} className={FIELD}>
              {options.map((o) => (
                <option key={o.topology} value={o.topology}>
                  {topologyName(o.topology)}
                </option>
              ))}
            </select>
            <Link to={paths.compare.href(compareQuery({ a: proposal.id, b: proposal.id, tailA: a, tailB: b }))} className={GO}>
              Set these two options side by side
            </Link>
          </div>
        )}
        <div className="flex flex-wrap items-center gap-2">
          <label htmlFor={`${id}-p`}>
            Compare {topologyName(a as TopologyId)} with another proposal of this project
          </label>
          {rankings.isPending ? (
            <span className="text-ink-soft dark:text-night-ink-soft">Looking for the project’s proposals…</span>
          ) : others.length === 0 ? (
            <span className="text-ink-soft dark:text-night-ink-soft">— this is the project’s only proposal.</span>
          ) : (
            <>
              <select id={`${id}-p`} value={otherId ?? ''} onChange={(e) => setOther(Number(e.target.value))} className={FIELD}>
                {others.map((p) => (
                  <option key={p.id} value={p.id}>
                    #{p.id} · {p.specTitle ?? `spec ${p.specId}`}, version {p.specVersionNumber ?? '?'} · {STATE_WORDS[p.status]}
                  </option>
                ))}
              </select>
              {otherId !== null && (
                <Link to={paths.compare.href(beside(proposal, others.find((p) => p.id === otherId)!, a))} className={GO}>
                  Set it beside this one
                </Link>
              )}
            </>
          )}
        </div>
        <p className="text-xs text-ink-soft dark:text-night-ink-soft">The other proposal shows the same option when it ranks one, else its current design; either side’s option can be changed there.</p>
      </div>
    </Sheet>
  );
}
