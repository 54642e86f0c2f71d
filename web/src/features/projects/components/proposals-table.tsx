import { Link } from 'react-router-dom';
import { StateBadge } from '../../../components/ui/state-badge';
import { paths } from '../../../config/paths';
import type { ProposalSummary, Spec } from '../../../lib/api-types';
import { topologyName } from '../../../lib/topology-names';
import { DenseTable, rowLink, Td, Th, Tr } from './dense-table';
import { When } from './when';

const soft = 'text-ink-soft dark:text-night-ink-soft';

export function ProposalsTable({ proposals, specs }: { projectId: number; proposals: readonly ProposalSummary[]; specs: readonly Spec[] }) {
  const titles = new Map(specs.map((s) => [s.id, s.title]));
  return (
    <DenseTable caption="Proposals of this project">
      <thead>
        <tr>
          <Th>Ranking</Th>
          <Th>Spec</Th>
          <Th className="text-right">Version</Th>
          <Th>Recommended tail</Th>
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
                <Link to={paths.proposal.href(proposal.id)} className={rowLink} aria-label={`Ranking #${proposal.id}`}>
                  #{proposal.id}
                </Link>
              </Td>
              <Td className="max-w-[22rem] truncate" title={proposal.specTitle ?? titles.get(proposal.specId)}>
                {proposal.specTitle ?? titles.get(proposal.specId) ?? <span className={soft}>Spec #{proposal.specId}</span>}
              </Td>
              <Td className="text-right tabular-nums">
                {version == null ? <span className={soft}>—</span> : `v${version}`}
              </Td>
              <Td className="whitespace-nowrap">
                {proposal.recommendedTopology ? topologyName(proposal.recommendedTopology) : <span className={soft}>None passes</span>}
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
