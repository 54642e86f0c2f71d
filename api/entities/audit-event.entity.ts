import { EntitySchema } from 'typeorm';
import { foreignKeyColumn, idColumn, shortTextColumn, timestampColumn } from './columns';
import { jsonColumn } from './json-column';

/** Append-only record of every change: who, what, when, and the records before and after. */
export interface AuditEvent {
  id: number;
  at: string;
  actorId: number | null;
  /** e.g. "spec.version-created", "proposal.decided". */
  action: string;
  entityType: string;
  entityId: number;
  projectId: number | null;
  proposalId: number | null;
  beforeId: number | null;
  afterId: number | null;
  /** Small JSON document (stored as text) with what a reader needs (new status, reason excerpt...). */
  details: Record<string, unknown>;
}

export const AuditEventEntity = new EntitySchema<AuditEvent>({
  name: 'AuditEvent',
  tableName: 'audit_event',
  columns: {
    id: idColumn,
    at: timestampColumn('at'),
    actorId: foreignKeyColumn('actor_id', true),
    action: shortTextColumn(60),
    entityType: { ...shortTextColumn(40), name: 'entity_type' },
    entityId: { type: 'integer', name: 'entity_id' },
    projectId: foreignKeyColumn('project_id', true),
    proposalId: foreignKeyColumn('proposal_id', true),
    beforeId: { type: 'integer', name: 'before_id', nullable: true },
    afterId: { type: 'integer', name: 'after_id', nullable: true },
    details: jsonColumn(),
  },
});
