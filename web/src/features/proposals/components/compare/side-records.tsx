import { Link } from 'react-router-dom';
import type { TopologyId } from '#shared/engine/types';
import { OptionVerdict } from '../../../../components/ui/verdict';
import { paths } from '../../../../config/paths';
import { topologyName } from '../../../../lib/topology-names';
import { blockingShortCount } from '../../lib/option-rows';
import { provenanceOf, type Side } from '../../lib/comparison';

/**
 * The record each column comes from, exactly: proposal, spec and version, engine version, rule set,
 * the option; and a choice of another option of the same ranking.
 */
export function SideRecords({ sides, onTail }: { sides: [Side, Side]; onTail: (key: Side['key'], topology: TopologyId) => void }) {
  return (
    <div className="grid gap-3 sm:grid-cols-2">
      {sides.map((side) => {
        const p = provenanceOf(side);
        const letter = side.key.toUpperCase();
        return (
          <section key={side.key} aria-label={`Side ${letter}`} data-side={side.key} className="min-w-0 rounded-lg border border-rule bg-sheet p-3 dark:border-night-rule dark:bg-night-sheet">
            <h2 className="flex flex-wrap items-baseline gap-x-2 text-base font-medium">
              <span className="rounded-sm border border-ink-soft/50 px-1.5 text-sm dark:border-night-ink-soft/50">{letter}</span>
              {p.name}
              {p.recommended && (
                <span className="text-sm font-normal text-fern dark:text-fern-bright">
                  <span aria-hidden="true">◆</span> recommended
                </span>
              )}
            </h2>
            <div className="mt-1">
              <OptionVerdict option={{ passes: side.option.passes, blockingShortCount: blockingShortCount(side.option), unsolved: side.option.predicted === null }} form="sentence" />
            </div>
            <dl className="mt-2 grid grid-cols-[auto_minmax(0,1fr)] gap-x-3 gap-y-0.5 text-sm">
              <dt className="text-ink-soft dark:text-night-ink-soft">Proposal</dt>
              <dd>
                <Link to={paths.proposal.href(p.proposalId)} className="text-fern underline dark:text-fern-bright">
                  #{p.proposalId}
                </Link>
              </dd>
              <dt className="text-ink-soft dark:text-night-ink-soft">Spec</dt>
              <dd className="break-words">
                <Link to={paths.spec.href(p.specId)} className="hover:underline">
                  {p.specTitle}
                </Link>
                , version {p.specVersion}
              </dd>
              <dt className="text-ink-soft dark:text-night-ink-soft">Engine</dt>
              <dd className="font-mono text-xs leading-5">{p.engineVersion}</dd>
              <dt className="text-ink-soft dark:text-night-ink-soft">Rule set</dt>
              <dd className="font-mono text-xs leading-5 break-all">{p.rulesetVersion}</dd>
            </dl>
            <label className="mt-2 flex flex-wrap items-center gap-2 text-sm">
              <span className="text-ink-soft dark:text-night-ink-soft">Option</span>
              <select
                value={side.option.topology}
                onChange={(event) => onTail(side.key, event.target.value as TopologyId)}
                className="min-w-0 rounded-md border border-rule bg-sheet px-2 py-1 dark:border-night-rule dark:bg-night-sheet"
              >
                {side.proposal.result.options.map((o) => (
                  <option key={o.topology} value={o.topology}>
                    {o.rank}. {topologyName(o.topology)}
                  </option>
                ))}
              </select>
            </label>
          </section>
        );
      })}
    </div>
  );
}
