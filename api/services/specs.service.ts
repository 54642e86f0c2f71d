/**
 * Requirement specs: every edit is a new immutable version; versions can be listed and compared.
 * The spec document is validated against the shared schema before anything is written.
 */
import type { DataSource, EntityManager } from 'typeorm';
import type { Spec as SpecDocument } from '#shared/engine/types';
import { diffJson } from '#shared/json-diff';
import { queueNotification } from './notifications.service';
import { validateSpec } from '#shared/validate';
import type { Action } from '#shared/workflow/roles';
import { SpecVersionEntity, type SpecVersion } from '../entities/spec-version.entity';
import { SpecEntity, type Spec } from '../entities/spec.entity';
import { lockRowForUpdate } from '../data-source';
import { AppError, invalid, notFound } from '../errors';
import { recordEvent } from './audit.service';
import { projectFor } from './projects.service';
import { indexRecords } from './search-index.service';
import type { PublicUser } from './users.service';
import type { SpecDiff, SpecInput, SpecVersion as SpecVersionView, SpecWithLatest } from '#shared/api/specs';

type Viewer = Pick<PublicUser, 'id' | 'role'>;

export type { SpecInput };

/** The note as stored: trimmed, null when absent or blank. */
const noteOf = (input: Pick<SpecInput, 'note'>) => input.note?.trim() || null;

/** The spec document checked against the schema (defaults applied); errors located under /payload. */
export function checkedSpecDocument(payload: unknown): SpecDocument {
  const result = validateSpec(payload);
  if (!result.ok) throw invalid(result.errors.map((e) => ({ path: `/payload${e.path}`, message: e.message })), 'The spec is not valid.');
  return result.value;
}

/**
 * The spec document of a stored version, ready for the engine: the one read of a stored payload
 * for analysis, checked against the current schema (defaults applied), so a version written
 * under an older schema is refused with the schema's own errors rather than mis-analysed.
 */
export function storedSpecDocument(version: Pick<SpecVersion, 'payload'>): SpecDocument {
  return checkedSpecDocument(version.payload);
}

/** A stored spec version with its document ready for the engine (storedSpecDocument). */
export async function specVersionDocument(manager: EntityManager | DataSource, specVersionId: number): Promise<{ version: SpecVersion; spec: SpecDocument }> {
  const version = await manager.getRepository(SpecVersionEntity).findOneByOrFail({ id: specVersionId });
  return { version, spec: storedSpecDocument(version) };
}

/**
 * The spec if its project is visible to the viewer, else 404; with an action, also a 403 unless
 * the role the viewer holds in the spec's project may take it.
 */
export async function specFor(manager: EntityManager | DataSource, viewer: Viewer, specId: number, action?: Action): Promise<Spec> {
  const spec = await manager.getRepository(SpecEntity).findOneBy({ id: specId });
  if (!spec) throw notFound('spec');
  try {
    await projectFor(manager, viewer, spec.projectId, action);
  } catch (error) {
    if (error instanceof AppError && error.status === 403) throw error;
    throw notFound('spec');
  }
  return spec;
}

export async function latestVersion(manager: EntityManager | DataSource, spec: Spec): Promise<SpecVersion> {
  const version = await manager.getRepository(SpecVersionEntity).findOneBy({ specId: spec.id, version: spec.latestVersion });
  if (!version) throw notFound('spec-version');
  return version;
}

export async function listSpecs(dataSource: DataSource, viewer: Viewer, projectId: number): Promise<Spec[]> {
  await projectFor(dataSource, viewer, projectId);
  return dataSource.getRepository(SpecEntity).find({ where: { projectId }, order: { id: 'ASC' } });
}

export async function getSpec(dataSource: DataSource, viewer: Viewer, specId: number): Promise<SpecWithLatest> {
  const spec = await specFor(dataSource, viewer, specId);
  return { ...spec, latest: await latestVersion(dataSource, spec) };
}

export async function createSpec(dataSource: DataSource, actor: Viewer, projectId: number, input: SpecInput): Promise<SpecWithLatest> {
  const document = checkedSpecDocument({ ...(input.payload as object), title: input.title.trim() });
  return dataSource.transaction(async (manager) => {
    await projectFor(manager, actor, projectId, 'specs:write');
    const { spec, version } = await insertSpec(manager, actor, projectId, input.title.trim(), document, {}, noteOf(input));
    return { ...spec, latest: version };
  });
}

/**
 * Inside the caller's transaction: a new spec with its first version and its `spec.created`
 * event (`details` adds to the event's details, e.g. the import row it came from).
 */
export async function insertSpec(manager: EntityManager, actor: Viewer, projectId: number, title: string, document: SpecDocument, details: Record<string, unknown> = {}, note: string | null = null) {
  const now = new Date().toISOString();
  const spec = await manager.getRepository(SpecEntity).save({ projectId, title, latestVersion: 1, createdById: actor.id, createdAt: now, updatedAt: now });
  const version = await manager.getRepository(SpecVersionEntity).save({ specId: spec.id, version: 1, title: spec.title, payload: document, note, createdById: actor.id, createdAt: now });
  await recordEvent(manager, { actorId: actor.id, action: 'spec.created', entityType: 'spec', entityId: spec.id, projectId, afterId: version.id, details: { title: spec.title, version: 1, ...details } });
  await indexRecords(manager, 'spec', [spec.id]);
  return { spec, version };
}

/**
 * Inside the caller's transaction: the spec's next version (after `previous`, its latest), the
 * spec moved to it, the `spec.version-created` event with the number of changed fields, and the
 * notice to whoever ranked an earlier version.
 */
export async function insertSpecVersion(manager: EntityManager, actor: Viewer, spec: Spec, previous: SpecVersion, title: string, document: SpecDocument, details: Record<string, unknown> = {}, note: string | null = null) {
  const now = new Date().toISOString();
  const number = spec.latestVersion + 1;
  const version = await manager.getRepository(SpecVersionEntity).save({ specId: spec.id, version: number, title, payload: document, note, createdById: actor.id, createdAt: now });
  await manager.getRepository(SpecEntity).update({ id: spec.id }, { latestVersion: number, title: version.title, updatedAt: now });
  const changes = diffJson(previous.payload, document).length;
  await recordEvent(manager, {
    actorId: actor.id,
    action: 'spec.version-created',
    entityType: 'spec',
    entityId: spec.id,
    projectId: spec.projectId,
    beforeId: previous.id,
    afterId: version.id,
    details: { version: number, changes, ...(note ? { note } : {}), ...details },
  });
  await indexRecords(manager, 'spec', [spec.id]);
  // Whoever ranked an earlier version hears of the new one (spec.new-version), with this change.
  await queueNotification(manager, { kind: 'spec.new-version', specVersionId: version.id, changes, actorId: actor.id });
  return { spec: { ...spec, title: version.title, latestVersion: number, updatedAt: now }, version };
}

export async function updateSpec(dataSource: DataSource, actor: Viewer, specId: number, input: SpecInput): Promise<SpecWithLatest> {
  const document = checkedSpecDocument({ ...(input.payload as object), title: input.title.trim() });
  return dataSource.transaction(async (manager) => {
    // PostgreSQL: concurrent edits of one spec take version numbers one after the other.
    await lockRowForUpdate(manager, SpecEntity, specId);
    const spec = await specFor(manager, actor, specId, 'specs:write');
    const previous = await latestVersion(manager, spec);
    // Nothing to record when the document (defaults applied, title included) is what the latest version holds.
    if (sameDocument(previous.payload, document)) return { ...spec, latest: previous, unchanged: true };
    const written = await insertSpecVersion(manager, actor, spec, previous, input.title.trim(), document, {}, noteOf(input));
    return { ...written.spec, latest: written.version, unchanged: false };
  });
}

/** Two spec documents hold the same values (key order aside). */
export function sameDocument(a: unknown, b: unknown): boolean {
  return diffJson(a, b).length === 0;
}

export async function listVersions(dataSource: DataSource, viewer: Viewer, specId: number): Promise<SpecVersionView[]> {
  await specFor(dataSource, viewer, specId);
  const versions = await dataSource.getRepository(SpecVersionEntity).find({ where: { specId }, order: { version: 'ASC' } });
  return versions;
}

/** Field-by-field differences between two versions of a spec. */
export async function diffVersions(dataSource: DataSource, viewer: Viewer, specId: number, from: number, to: number): Promise<SpecDiff> {
  await specFor(dataSource, viewer, specId);
  const repository = dataSource.getRepository(SpecVersionEntity);
  const [a, b] = await Promise.all([repository.findOneBy({ specId, version: from }), repository.findOneBy({ specId, version: to })]);
  if (!a || !b) throw notFound('spec-version');
  return { from, to, changes: diffJson(a.payload, b.payload) };
}
