import { EntitySchema } from 'typeorm';
import { foreignKeyColumn, idColumn, shortTextColumn, timestampColumn } from './columns';
import { jsonColumn } from './json-column';
import type { AuditEvent } from '#shared/api/admin';

/** Append-only record of every change: the wire shape itself (`details` is JSON text in the row). */
export type { AuditEvent };

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
