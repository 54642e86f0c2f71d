import { useQueries } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { StateBadge } from '../../../components/ui/state-badge';
import { paths } from '../../../config/paths';
import type { ProposalSummary, Spec } from '../../../lib/api-types';
import { projectSpecVersionsQuery } from '../api/project-queries';
import { topologyWords } from '../utils/topology-words';
import { DenseTable, rowLink, Td, Th, Tr } from './dense-table';
import { When } from './when';

/** Version numbers by spec-version id, for the specs that appear on this page. */
function useVersionNumbers(projectId: number, proposals: readonly ProposalSummary[]): Map<number, number> {
  const specIds = [...new Set(proposals.map((p) => p.specId))];
  return useQueries({
    queries: specIds.map((specId) => projectSpecVersionsQuery(projectId, specId)),
    combine: (results) => new Map(results.flatMap((r) => r.data?.items.map((v) => [v.id, v.version] as const) ?? [])),
  });
}

const soft = 'text-ink-soft dark:text-night-ink-soft';

export function ProposalsTable({ projectId, proposals, specs }: { projectId: number; proposals: readonly ProposalSummary[]; specs: readonly Spec[] }) {
  const titles = new Map(specs.map((s) => [s.id, s.title]));
  const versions = useVersionNumbers(projectId, proposals);
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
          const version = versions.get(proposal.specVersionId);
          return (
            <Tr key={proposal.id}>
              <Td className="tabular-nums">
                <Link to={paths.proposal.href(proposal.id)} className={rowLink} aria-label={`Ranking #${proposal.id}`}>
                  #{proposal.id}
                </Link>
              </Td>
              <Td className="max-w-[22rem] truncate" title={titles.get(proposal.specId)}>
                {titles.get(proposal.specId) ?? <span className={soft}>Spec #{proposal.specId}</span>}
              </Td>
              <Td className="text-right tabular-nums">
                {version === undefined ? (
                  <span className={soft} aria-label="version loading">
                    …
                  </span>
                ) : (
                  `v${version}`
                )}
              </Td>
              <Td className="whitespace-nowrap">
                {proposal.recommendedTopology ? topologyWords(proposal.recommendedTopology) : <span className={soft}>None passes</span>}
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
