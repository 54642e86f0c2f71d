/**
 * The engine outputs proposals rank with, each distinct one stored once (`ranking` rows, keyed by
 * the SHA-256 of the JSON text) and referred to by every proposal that carries it.
 */
import { createHash } from 'node:crypto';
import { In, type DataSource, type EntityManager } from 'typeorm';
import type { RecommendResult } from '#shared/engine/recommend';
import { RankingEntity } from '../entities/ranking.entity';

type Manager = DataSource | EntityManager;

/** The content key of a ranking: SHA-256 of its JSON text, hex. */
export const rankingHash = (text: string): string => createHash('sha256').update(text, 'utf8').digest('hex');

/**
 * The id of the ranking row holding exactly this JSON text: the existing row, or one written now.
 * Two writers of the same text at once end with one row (the second insert is ignored).
 */
export async function storeRanking(manager: Manager, text: string): Promise<number> {
  const contentHash = rankingHash(text);
  const repository = manager.getRepository(RankingEntity);
  const existing = await repository.findOne({ select: { id: true }, where: { contentHash } });
  if (existing) return existing.id;
  await repository.createQueryBuilder().insert().values({ contentHash, result: text, createdAt: new Date().toISOString() }).orIgnore().execute();
  return (await repository.findOneOrFail({ select: { id: true }, where: { contentHash } })).id;
}

/** The stored JSON text of a ranking, as written. */
export async function rankingText(manager: Manager, rankingId: number): Promise<string> {
  return (await manager.getRepository(RankingEntity).findOneOrFail({ select: { id: true, result: true }, where: { id: rankingId } })).result;
}

/** The engine output a proposal ranks with. */
export async function rankingOf(manager: Manager, proposal: { rankingId: number }): Promise<RecommendResult> {
  return JSON.parse(await rankingText(manager, proposal.rankingId)) as RecommendResult;
}

/** The engine outputs of several proposals, by ranking id (each distinct one read once). */
export async function rankingsOf(manager: Manager, proposals: readonly { rankingId: number }[]): Promise<Map<number, RecommendResult>> {
  const ids = [...new Set(proposals.map((p) => p.rankingId))];
  const rows = ids.length ? await manager.getRepository(RankingEntity).find({ select: { id: true, result: true }, where: { id: In(ids) } }) : [];
  return new Map(rows.map((r) => [r.id, JSON.parse(r.result) as RecommendResult]));
}
