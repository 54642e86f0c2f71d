/** The append-only audit trail: one event per change, written in the change's own transaction. */
import type { EntityManager } from 'typeorm';
import { AuditEventEntity, type AuditEvent } from '../entities/audit-event.entity';

export interface AuditInput {
  actorId: number | null;
  action: string;
  entityType: string;
  entityId: number;
  projectId?: number | null;
  proposalId?: number | null;
  beforeId?: number | null;
  afterId?: number | null;
  details?: Record<string, unknown>;
}

export async function recordEvent(manager: EntityManager, input: AuditInput): Promise<AuditEvent> {
  return manager.getRepository(AuditEventEntity).save({
    at: new Date().toISOString(),
    actorId: input.actorId,
    action: input.action,
    entityType: input.entityType,
    entityId: input.entityId,
    projectId: input.projectId ?? null,
    proposalId: input.proposalId ?? null,
    beforeId: input.beforeId ?? null,
    afterId: input.afterId ?? null,
    details: input.details ?? {},
  });
}

