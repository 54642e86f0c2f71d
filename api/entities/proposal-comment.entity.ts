import { EntitySchema } from 'typeorm';
import type { CommentAnchorKind } from '#shared/workflow/comments';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';

/**
 * A comment on a proposal: a thread's first comment (`parentId` null) with its anchor, or a reply
 * (`parentId` the thread; the anchor copied from it). Each row keeps the proposal's spec version,
 * engine and rule-set versions, so a comment shown is known to belong to that record.
 */
export interface ProposalComment {
  id: number;
  proposalId: number;
  projectId: number;
  parentId: number | null;
  anchorKind: CommentAnchorKind;
  topology: string;
  checkId: string | null;
  figureKey: string | null;
  verificationJobId: number | null;
  specVersionId: number;
  engineVersion: string;
  rulesetVersion: string;
  body: string;
  authorId: number;
  createdAt: string;
  resolvedAt: string | null;
  resolvedById: number | null;
}

export const ProposalCommentEntity = new EntitySchema<ProposalComment>({
  name: 'ProposalComment',
  tableName: 'proposal_comment',
  columns: {
    id: idColumn,
    proposalId: foreignKeyColumn('proposal_id'),
    projectId: foreignKeyColumn('project_id'),
    parentId: foreignKeyColumn('parent_id', true),
    anchorKind: { ...shortTextColumn(20), name: 'anchor_kind' },
    topology: shortTextColumn(40),
    checkId: { ...shortTextColumn(80, true), name: 'check_id' },
    figureKey: { ...shortTextColumn(40, true), name: 'figure_key' },
    verificationJobId: foreignKeyColumn('verification_job_id', true),
    specVersionId: foreignKeyColumn('spec_version_id'),
    engineVersion: { ...shortTextColumn(40), name: 'engine_version' },
    rulesetVersion: { ...shortTextColumn(80), name: 'ruleset_version' },
    body: textColumn(),
    authorId: foreignKeyColumn('author_id'),
    createdAt: timestampColumn('created_at'),
    resolvedAt: { ...timestampColumn('resolved_at'), nullable: true },
    resolvedById: foreignKeyColumn('resolved_by_id', true),
  },
});
