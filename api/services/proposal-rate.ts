/**
 * The per-person limit on asking for proposals (POST /api/specs/:id/proposals): a 429 with
 * Retry-After, checked before the engine runs.
 */
import { MoreThan, type DataSource } from 'typeorm';
import { ProposalEntity } from '../entities/proposal.entity';
import { AppError } from '../errors';

/**
 * Proposals one person may ask for per minute (PROPOSAL_RATE_WINDOW_MS), the default of
 * LONGTAIL_PROPOSALS_PER_MINUTE. Each runs the engine for up to a few hundred milliseconds of CPU,
 * so a batch still ranks at about one spec a second while nobody keeps the engine from the rest
 * of the team. Counted from the stored proposals, so it holds across app instances.
 */
export const PROPOSALS_PER_MINUTE = 60;
export const PROPOSAL_RATE_WINDOW_MS = 60_000;

/** A 429 with Retry-After when the person asked for `perMinute` proposals within the last minute. */
export async function checkProposalRate(dataSource: DataSource, actorId: number, perMinute: number): Promise<void> {
  const now = Date.now();
  const since = new Date(now - PROPOSAL_RATE_WINDOW_MS).toISOString();
  // Only the person's perMinute-th newest proposal in the window matters: when there is one, the
  // limit is reached. One row is read, however high the limit is set.
  const [limiting] = await dataSource.getRepository(ProposalEntity).find({
    select: { id: true, createdAt: true },
    where: { createdById: actorId, createdAt: MoreThan(since) },
    order: { createdAt: 'DESC', id: 'DESC' },
    skip: perMinute - 1,
    take: 1,
  });
  if (!limiting) return;
  // The moment the oldest of the last `perMinute` leaves the window, one more is allowed.
  const retryAfterS = Math.max(1, Math.ceil((Date.parse(limiting.createdAt) + PROPOSAL_RATE_WINDOW_MS - now) / 1000));
  const error = new AppError(
    'too-many-proposals',
    429,
    `You asked for ${perMinute} proposals in the last minute, the most one person may (each runs the engine for everyone's server). Try again in ${retryAfterS} s.`,
    [{ path: '', message: `at most ${perMinute} proposals a minute per person; retry after ${retryAfterS} s` }],
  );
  error.headers = { 'Retry-After': String(retryAfterS) };
  throw error;
}
