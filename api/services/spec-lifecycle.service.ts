/**
 * What a spec's newer versions do to the proposals of its older ones: ranking a newer version
 * closes the older rankings still waiting for a designer as superseded (each with its audit event,
 * and one e-mail digest per person concerned); any proposal of an older version shows that the
 * spec has moved on, with the field-by-field differences.
 */
import { In, LessThan, type DataSource, type EntityManager } from 'typeorm';
import type { SpecMovedOn } from '#shared/api/proposals';
import { diffJson } from '#shared/json-diff';
import { nextState, SUPERSEDABLE_STATES } from '#shared/workflow/proposal-states';
import { ProposalEntity, type Proposal } from '../entities/proposal.entity';
import { SpecVersionEntity, type SpecVersion } from '../entities/spec-version.entity';
import { SpecEntity } from '../entities/spec.entity';
import { lockRowForUpdate } from '../data-source';
import { recordEvent } from './audit.service';
import { queueNotification } from './notifications.service';
import { indexRecords } from './search-index.service';

/**
 * Inside the transaction that stores `newer` (a proposal of `version`): every proposal of an
 * older version of the same spec that still waits for a designer becomes superseded by it.
 * Returns the ids closed.
 */
export async function supersedeOlderRankings(manager: EntityManager, actorId: number, newer: Proposal, version: SpecVersion): Promise<number[]> {
  const older = await manager.getRepository(SpecVersionEntity).find({ select: { id: true, version: true }, where: { specId: version.specId, version: LessThan(version.version) } });
  if (older.length === 0) return [];
  const versionOf = new Map(older.map((v) => [v.id, v.version]));
  const candidates = await manager.getRepository(ProposalEntity).find({
    select: { id: true },
    where: { specId: version.specId, specVersionId: In([...versionOf.keys()]), status: In([...SUPERSEDABLE_STATES]) },
    order: { id: 'ASC' },
  });
  const closed: number[] = [];
  for (const { id } of candidates) {
    // A decision on it may be under way: wait for it, then look again.
    await lockRowForUpdate(manager, ProposalEntity, id);
    const proposal = await manager.getRepository(ProposalEntity).findOneOrFail({ select: { id: true, status: true, specVersionId: true, projectId: true }, where: { id } });
    const status = nextState(proposal.status, 'supersede');
    if (!status) continue;
    const now = new Date().toISOString();
    await manager.getRepository(ProposalEntity).update({ id }, { status, supersededById: newer.id, closedById: null, closedReason: null, closedAt: now, updatedAt: now });
    await recordEvent(manager, {
      actorId,
      action: 'proposal.superseded',
      entityType: 'proposal',
      entityId: id,
      projectId: proposal.projectId,
      proposalId: id,
      beforeId: id,
      afterId: newer.id,
      details: { from: proposal.status, to: status, byProposal: newer.id, specVersion: versionOf.get(proposal.specVersionId), newerSpecVersion: version.version },
    });
    closed.push(id);
  }
  if (closed.length > 0) await queueNotification(manager, { kind: 'proposal.superseded', proposalId: newer.id, closedIds: closed, actorId });
  await indexRecords(manager, 'proposal', closed);
  return closed;
}

export type { SpecMovedOn };

export async function specMovedOn(dataSource: DataSource | EntityManager, proposal: Pick<Proposal, 'specId'>, version: SpecVersion): Promise<SpecMovedOn | null> {
  const spec = await dataSource.getRepository(SpecEntity).findOneOrFail({ select: { id: true, latestVersion: true }, where: { id: proposal.specId } });
  if (spec.latestVersion <= version.version) return null;
  const latest = await dataSource.getRepository(SpecVersionEntity).findOneByOrFail({ specId: spec.id, version: spec.latestVersion });
  return { latestVersion: latest.version, latestTitle: latest.title, changes: diffJson(version.payload, latest.payload), latestNote: latest.note, latestPayload: latest.payload };
}
