import { Link } from 'react-router-dom';
import { StateBadge } from '../../../components/ui/state-badge';
import { paths } from '../../../config/paths';
import type { ProposalSummary } from '#shared/api/proposals';
import type { Spec } from '#shared/api/specs';
import { topologyName } from '../../../lib/topology-names';
import { DenseTable, rowLink, Td, Th, Tr } from '../../../components/ui/dense-table';
import { When } from '../../../components/ui/when';
import { currentDesignName, currentDesignSummary } from '#shared/workflow/current-design';

const soft = 'text-ink-soft dark:text-night-ink-soft';

/**
 * The proposal's current design (shared/workflow/current-design.ts): the decided design once
 * someone decided, the recommendation until then; the recommendation and the designer's reason
 * beside it when they differ.
 */
export function CurrentDesignCell({ proposal }: { proposal: ProposalSummary }) {
  const current = proposal.currentDesign ?? currentDesignSummary(proposal.recommendedTopology, null);
  if (!current) return <span className={soft}>None passes</span>;
  const word = current.basis === 'recommendation' ? 'recommended' : proposal.status === 'approved' ? 'signed off' : 'decided';
  return (
    <div data-current-design={current.topology}>
      <span className="whitespace-nowrap">{currentDesignName(current)}</span> <span className={`text-xs ${soft}`}>({word})</span>
      {current.differsFromRecommendation && (
        <span className={`block max-w-[22rem] truncate text-xs ${soft}`} title={current.reason ?? undefined}>
          recommended: {current.recommended ? topologyName(current.recommended) : 'none'}
          {current.reason ? ` · why: ${current.reason}` : ''}
        </span>
      )}
    </div>
  );
}

export function ProposalsTable({ proposals, specs }: { projectId: number; proposals: readonly ProposalSummary[]; specs: readonly Spec[] }) {
  const titles = new Map(specs.map((s) => [s.id, s.title]));
  return (
    <DenseTable caption="Proposals of this project">
      <thead>
        <tr>
          <Th>Proposal</Th>
          <Th>Spec</Th>
          <Th className="text-right">Version</Th>
          <Th>Design</Th>
          <Th>State</Th>
          <Th>Created</Th>
          <Th>Updated</Th>
        </tr>
      </thead>
      <tbody>
        {proposals.map((proposal) => {
          const version = proposal.specVersionNumber;
          return (
            <Tr key={proposal.id}>
              <Td className="tabular-nums">
                <Link to={paths.proposal.href(proposal.id)} className={rowLink} aria-label={`Proposal #${proposal.id}`}>
                  #{proposal.id}
                </Link>
              </Td>
              <Td className="max-w-[22rem] truncate" title={proposal.specTitle ?? titles.get(proposal.specId)}>
                {proposal.specTitle ?? titles.get(proposal.specId) ?? <span className={soft}>Spec #{proposal.specId}</span>}
              </Td>
              <Td className="text-right tabular-nums">
                {version == null ? <span className={soft}>—</span> : `v${version}`}
              </Td>
              <Td className="min-w-[10rem]">
                <CurrentDesignCell proposal={proposal} />
              </Td>
              <Td>
                <StateBadge state={proposal.status} />
              </Td>
              <Td className={soft}>
                <When iso={proposal.createdAt} />
              </Td>
              <Td className={soft}>
                <When iso={proposal.updatedAt} />
              </Td>
            </Tr>
          );
        })}
      </tbody>
    </DenseTable>
  );
}
