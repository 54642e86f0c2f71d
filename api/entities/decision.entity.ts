import { EntitySchema } from 'typeorm';
import type { DecisionKind } from '../../shared/workflow/current-design';
import type { RecommendOption } from '../../shared/engine/recommend';
import type { Design } from '../../shared/engine/types';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';
import { jsonColumn } from './json-column';

export type { DecisionKind };

/** A designer's decision on a proposal; an override carries its own design and its evaluation. */
export interface Decision {
  id: number;
  proposalId: number;
  kind: DecisionKind;
  topology: string;
  /** The chosen design (analyze input; JSON text in the row). */
  design: Design;
  /** For an override: its predictions, figures and checks (JSON text in the row); else null. */
  evaluation: RecommendOption | null;
  reason: string | null;
  decidedById: number;
  createdAt: string;
  /** The engine and rule set that checked the decided design (null on decisions recorded before they were kept). */
  engineVersion: string | null;
  rulesetVersion: string | null;
}

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
