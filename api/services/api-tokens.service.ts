/**
 * Personal API tokens: made, listed and revoked by their owner; a request that carries one acts
 * as its owner with the owner's account role and project roles of that moment (findSessionUser,
 * as a session does). A token is `ltk_` and 43 base64url characters (32 random bytes); only its
 * SHA-256 is stored. Every use writes an audit event (`api-token.used`, the method and path),
 * and making and revoking one are audited too.
 */
import { createHash, randomBytes } from 'node:crypto';
import { IsNull, MoreThan, type DataSource } from 'typeorm';
import type { ApiToken, ApiTokenInput, NewApiToken, SessionUser } from '#shared/api/users';
import { ApiTokenEntity, type ApiTokenRow } from '../entities/api-token.entity';
import { AppError, invalid, notFound } from '../errors';
import { recordEvent } from './audit.service';
import { findSessionUser } from './users.service';

/** The recognisable start of every token (secret scanners can look for it). */
export const TOKEN_PREFIX = 'ltk_';
const TOKEN_PATTERN = /^ltk_[A-Za-z0-9_-]{43}$/;
/** Tokens one person may make per hour (a leaked session cannot mint many), counted from the stored rows. */
export const TOKENS_PER_HOUR = 10;
const TOKEN_RATE_WINDOW_MS = 60 * 60 * 1000;
/** Tokens one person may hold unrevoked. */
export const MAX_LIVE_TOKENS = 20;

const hashOf = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

function wireToken(row: ApiTokenRow): ApiToken {
  return { id: row.id, name: row.name, start: row.tokenStart, createdAt: row.createdAt, lastUsedAt: row.lastUsedAt, revokedAt: row.revokedAt };
}

/** The person's tokens, newest first (revoked ones too, marked). */
export async function listApiTokens(dataSource: DataSource, userId: number): Promise<ApiToken[]> {
  const rows = await dataSource.getRepository(ApiTokenEntity).find({ where: { userId }, order: { id: 'DESC' } });
  return rows.map(wireToken);
}

/** A new token for the person: the answer holds the token itself, the only time it is shown. */
export async function createApiToken(dataSource: DataSource, userId: number, input: ApiTokenInput): Promise<NewApiToken> {
  const name = input.name.trim();
  if (name === '') throw invalid([{ path: '/name', message: 'must not be blank' }]);
  const repository = dataSource.getRepository(ApiTokenEntity);
  const now = Date.now();
  const recent = await repository.find({
    select: { id: true, createdAt: true },
    where: { userId, createdAt: MoreThan(new Date(now - TOKEN_RATE_WINDOW_MS).toISOString()) },
    order: { createdAt: 'DESC', id: 'DESC' },
    skip: TOKENS_PER_HOUR - 1,
    take: 1,
  });
  if (recent.length > 0) {
    const retryAfterS = Math.max(1, Math.ceil((Date.parse(recent[0].createdAt) + TOKEN_RATE_WINDOW_MS - now) / 1000));
    const error = new AppError('too-many-tokens', 429, `You made ${TOKENS_PER_HOUR} API tokens in the last hour, the most one person may. Try again in ${Math.ceil(retryAfterS / 60)} min.`);
    error.headers = { 'Retry-After': String(retryAfterS) };
    throw error;
  }
  if ((await repository.countBy({ userId, revokedAt: IsNull() })) >= MAX_LIVE_TOKENS) {
    throw new AppError('too-many-tokens', 409, `You hold ${MAX_LIVE_TOKENS} API tokens: revoke one you no longer use first.`);
  }
  const token = `${TOKEN_PREFIX}${randomBytes(32).toString('base64url')}`;
  return dataSource.transaction(async (manager) => {
    const row = await manager.getRepository(ApiTokenEntity).save({
      userId,
      name,
      tokenHash: hashOf(token),
      tokenStart: token.slice(0, TOKEN_PREFIX.length + 6),
      createdAt: new Date(now).toISOString(),
      lastUsedAt: null,
      revokedAt: null,
    });
    await recordEvent(manager, { actorId: userId, action: 'api-token.created', entityType: 'api-token', entityId: row.id, details: { name } });
    return { ...wireToken(row), token };
  });
}

/** Revokes one of the person's own tokens (404 for anyone else's); revoking twice changes nothing. */
export async function revokeApiToken(dataSource: DataSource, userId: number, id: number): Promise<ApiToken> {
  return dataSource.transaction(async (manager) => {
    const repository = manager.getRepository(ApiTokenEntity);
    const row = await repository.findOneBy({ id, userId });
    if (!row) throw notFound('api-token');
    if (row.revokedAt !== null) return wireToken(row);
    row.revokedAt = new Date().toISOString();
    await repository.update({ id }, { revokedAt: row.revokedAt });
    await recordEvent(manager, { actorId: userId, action: 'api-token.revoked', entityType: 'api-token', entityId: id, details: { name: row.name } });
    return wireToken(row);
  });
}

const tokenRefused = () => new AppError('token-invalid', 401, 'This API token is not valid: it is unknown, revoked, or its account is disabled. Make a new one on your profile page.');

/**
 * The person a bearer token acts as, with the use recorded (last-used time and an audit event
 * naming the method and path, in one transaction); 401 token-invalid for an unknown or revoked
 * token or a disabled account.
 */
export async function authenticateApiToken(dataSource: DataSource, token: string, use: { method: string; path: string }): Promise<{ user: SessionUser; tokenId: number }> {
  if (!TOKEN_PATTERN.test(token)) throw tokenRefused();
  const row = await dataSource.getRepository(ApiTokenEntity).findOneBy({ tokenHash: hashOf(token), revokedAt: IsNull() });
  if (!row) throw tokenRefused();
  const user = await findSessionUser(dataSource, row.userId);
  if (!user || user.disabledAt !== null) throw tokenRefused();
  await dataSource.transaction(async (manager) => {
    const at = new Date().toISOString();
    await manager.getRepository(ApiTokenEntity).update({ id: row.id }, { lastUsedAt: at });
    await recordEvent(manager, { actorId: user.id, action: 'api-token.used', entityType: 'api-token', entityId: row.id, details: { method: use.method, path: use.path } });
  });
  return { user, tokenId: row.id };
}
