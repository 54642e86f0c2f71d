import { EntitySchema } from 'typeorm';
import type { ProposalSummary } from '#shared/api/proposals';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';

/**
 * The engine's ranking of one spec version, with the versions that reproduce it. The ranking
 * itself (tens of kB: every option's curves and Monte Carlo figures) is a `ranking` row shared by
 * the proposals that carry the same output, so this row stays small for the lists.
 */
export type Proposal = Omit<ProposalSummary, 'specVersionNumber' | 'specTitle' | 'currentDesign'> & {
  /** The engine output (`recommend`) this proposal ranks with: a row shared by every proposal with the same output. */
  rankingId: number;
};

export const ProposalEntity = new EntitySchema<Proposal>({
  name: 'Proposal',
  tableName: 'proposal',
  columns: {
    id: idColumn,
    projectId: foreignKeyColumn('project_id'),
    specId: foreignKeyColumn('spec_id'),
    specVersionId: foreignKeyColumn('spec_version_id'),
    engineVersion: { ...shortTextColumn(20), name: 'engine_version' },
    rulesetVersion: { ...shortTextColumn(64), name: 'ruleset_version' },
    rankingId: foreignKeyColumn('ranking_id'),
    recommendedTopology: { ...shortTextColumn(40, true), name: 'recommended_topology' },
    status: shortTextColumn(20),
    supersededById: foreignKeyColumn('superseded_by_id', true),
    closedReason: { ...textColumn(true), name: 'closed_reason' },
    closedById: foreignKeyColumn('closed_by_id', true),
    closedAt: { ...timestampColumn('closed_at'), nullable: true },
    createdById: foreignKeyColumn('created_by_id'),
    createdAt: timestampColumn('created_at'),
    updatedAt: timestampColumn('updated_at'),
  },
});
