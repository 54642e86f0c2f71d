import { EntitySchema } from 'typeorm';
import type { DecisionKind } from '#shared/workflow/current-design';
import type { Decision as WireDecision } from '#shared/api/proposals';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';
import { jsonColumn } from './json-column';

export type { DecisionKind };

/** A designer's decision on a proposal, as stored: the wire shape (the design and an override's evaluation are JSON text in the row), its versions always present in the row. */
export type Decision = WireDecision & { engineVersion: string | null; rulesetVersion: string | null };

export const DecisionEntity = new EntitySchema<Decision>({
  name: 'Decision',
  tableName: 'decision',
  columns: {
    id: idColumn,
    proposalId: foreignKeyColumn('proposal_id'),
    kind: shortTextColumn(20),
    topology: shortTextColumn(40),
    design: jsonColumn(),
    evaluation: jsonColumn(true),
    reason: textColumn(true),
    decidedById: foreignKeyColumn('decided_by_id'),
    createdAt: timestampColumn('created_at'),
    engineVersion: { ...shortTextColumn(20, true), name: 'engine_version' },
    rulesetVersion: { ...shortTextColumn(64, true), name: 'ruleset_version' },
  },
});
