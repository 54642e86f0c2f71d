/**
 * The device library: NPN `.model` cards uploaded per project (read by
 * shared/devices/model-card.ts), listed for the spec form's picker and the project page.
 *
 * All or nothing: a file with any problem saves nothing (400, every problem with its line). A
 * card name already in the project's library (names are case-insensitive, as in SPICE) refuses
 * the whole file with 409: a card's text changes only through a replacement of that card.
 *
 * Removing or replacing a card retires its row instead of deleting it: specs record the card they
 * were filled from (name and the file's sha256), and that exact text stays readable
 * (`recordedDeviceModel`), marked as replaced or removed. The library holds at most
 * DEVICE_LIBRARY_QUOTA.cards cards and keeps at most DEVICE_LIBRARY_QUOTA.versions in all.
 */
import { createHash } from 'node:crypto';
import { In, IsNull, type DataSource, type EntityManager } from 'typeorm';
import { cardCommentLines, cardDevice, cardModel, cardNotes, cardSpiceOnlyParameters, readModelFile, type CardOrigin, type ModelCard } from '#shared/devices/model-card';
import { DEVICE_LIBRARY_QUOTA, type DeviceModelState, type DeviceModelView, type RecordedDeviceModel } from '#shared/devices/types';
import type { DeviceParams } from '#shared/engine/types';
import { DeviceModelEntity, type DeviceModel } from '../entities/device-model.entity';
import { UserEntity } from '../entities/user.entity';
import { lockRowForUpdate } from '../data-source';
import { ProjectEntity } from '../entities/project.entity';
import { AppError, invalid, notFound } from '../errors';
import { recordEvent } from './audit.service';
import { projectFor } from './projects.service';
import type { PublicUser } from './users.service';
import type { DeviceListQuery } from '#shared/api/devices';
import type { Page } from '#shared/api/lists';

type Viewer = Pick<PublicUser, 'id' | 'role'>;

/** A library card as the API shows it (shared/devices/types.ts). */
export type { DeviceModelView };

/** The uploaded file as the route received it. */
export interface UploadedModelFile {
  originalName: string;
  bytes: Uint8Array;
}

const stateOf = (row: DeviceModel): DeviceModelState => row.retirement ?? 'library';

function view(row: DeviceModel, names: Map<number, string>): DeviceModelView {
  const parameters = row.parameters;
  const person = (id: number) => ({ id, displayName: names.get(id) ?? `user #${id}` });
  return {
    id: row.id,
    projectId: row.projectId,
    name: row.name,
    device: cardDevice(parameters),
    parameters,
    notes: cardNotes(parameters),
    card: row.cardText,
    line: row.sourceLine,
    fileName: row.fileName,
    checksum: row.checksum,
    uploadedBy: person(row.uploadedById),
    uploadedAt: row.uploadedAt,
    state: stateOf(row),
    retiredAt: row.retiredAt,
    retiredBy: row.retiredById === null ? null : person(row.retiredById),
    replacedById: row.replacedById,
  };
}

async function views(manager: EntityManager | DataSource, rows: DeviceModel[]): Promise<DeviceModelView[]> {
  const ids = [...new Set(rows.flatMap((row) => (row.retiredById === null ? [row.uploadedById] : [row.uploadedById, row.retiredById])))];
  const users = ids.length > 0 ? await manager.getRepository(UserEntity).find({ select: { id: true, displayName: true }, where: { id: In(ids) } }) : [];
  const names = new Map(users.map((user) => [user.id, user.displayName]));
  return rows.map((row) => view(row, names));
}

export type { DeviceListQuery };

/** `q` as a LIKE pattern that matches it literally anywhere (`%`, `_` and `\` escaped). */
const containsPattern = (q: string) => `%${q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/**
 * One page of the project's library by name (`state: 'library'`), or of its removed and replaced
 * cards, newest retirement first (`state: 'former'`): `{ items, total, page, pageSize }`.
 */
export async function listDeviceModels(dataSource: DataSource, viewer: Viewer, projectId: number, query: DeviceListQuery): Promise<Page<DeviceModelView>> {
  await projectFor(dataSource, viewer, projectId);
  const builder = dataSource.getRepository(DeviceModelEntity).createQueryBuilder('d').where('d.projectId = :projectId', { projectId });
  if (query.state === 'library') builder.andWhere('d.retirement IS NULL').orderBy('d.nameKey', 'ASC');
  else builder.andWhere('d.retirement IS NOT NULL').orderBy('d.retiredAt', 'DESC');
  builder.addOrderBy('d.id', 'ASC');
  if (query.q) builder.andWhere("LOWER(d.name) LIKE :pattern ESCAPE '\\'", { pattern: containsPattern(query.q) });
  const [rows, total] = await builder.skip((query.page - 1) * query.pageSize).take(query.pageSize).getManyAndCount();
  return { items: await views(dataSource, rows), total, page: query.page, pageSize: query.pageSize };
}

/** One card of a visible project, in the library or retired. */
export async function getDeviceModel(dataSource: DataSource, viewer: Viewer, projectId: number, deviceId: number): Promise<DeviceModelView> {
  await projectFor(dataSource, viewer, projectId);
  const row = await dataSource.getRepository(DeviceModelEntity).findOneBy({ id: deviceId, projectId });
  if (!row) throw notFound('device-model');
  const [shown] = await views(dataSource, [row]);
  return shown;
}

/**
 * The stored card a spec's `deviceModel { name, checksum }` names: the card of that name (any
 * case) from the file of that sha256, the library's one first when the file was uploaded again
 * after a removal (same bytes, same text). Retired cards included: their text stays readable.
 */
async function recordedRow(manager: EntityManager | DataSource, projectId: number, reference: { name: string; checksum: string }): Promise<DeviceModel | null> {
  const rows = await manager.getRepository(DeviceModelEntity).find({ where: { projectId, checksum: reference.checksum.toLowerCase() }, order: { id: 'DESC' } });
  const named = rows.filter((row) => row.name.toLowerCase() === reference.name.toLowerCase());
  return named.find((row) => row.retirement === null) ?? named[0] ?? null;
}

/** What a spec's recorded card resolves to: the exact card it was filled from, and the library's card of that name today. */
export async function recordedDeviceModel(dataSource: DataSource, viewer: Viewer, projectId: number, reference: { name: string; checksum: string }): Promise<RecordedDeviceModel> {
  await projectFor(dataSource, viewer, projectId);
  const recorded = await recordedRow(dataSource, projectId, reference);
  const current =
    recorded?.retirement === null ? recorded : await dataSource.getRepository(DeviceModelEntity).findOneBy({ projectId, nameKey: reference.name.toLowerCase() });
  const shown = await views(dataSource, [recorded, current].filter((row): row is DeviceModel => row !== null));
  const byId = new Map(shown.map((card) => [card.id, card]));
  return { recorded: recorded ? (byId.get(recorded.id) ?? null) : null, current: current ? (byId.get(current.id) ?? null) : null };
}

/** The client's file name, reduced to a printable base name of at most 255 characters. */
export function safeFileName(original: string): string {
  const base = original.slice(Math.max(original.lastIndexOf('/'), original.lastIndexOf('\\')) + 1);
  let printable = '';
  for (const c of base) {
    const code = c.codePointAt(0) ?? 0;
    if (code >= 0x20 && !(code >= 0x7f && code <= 0x9f)) printable += c;
  }
  const trimmed = printable.trim();
  return trimmed === '' ? 'unnamed file' : [...trimmed].slice(0, 255).join('');
}

/** The stored row of one card read from an uploaded file, in the project's library. */
function libraryRow(projectId: number, card: ModelCard, origin: { fileName: string; checksum: string; uploadedById: number; uploadedAt: string }) {
  return {
    projectId,
    name: card.name,
    nameKey: card.name.toLowerCase(),
    parameters: card.parameters,
    cardText: card.text,
    sourceLine: card.line,
    ...origin,
  };
}

/**
 * An uploaded library file read whole: its printable base name, its cards and the sha256 of its
 * bytes; 400 with every problem on its line when any card cannot be read (nothing is stored).
 */
function readUploadedLibrary(file: UploadedModelFile) {
  const fileName = safeFileName(file.originalName);
  const result = readModelFile(file.bytes);
  if (!result.ok) {
    throw invalid(
      result.problems.map((problem) => ({ path: '/file', message: problem.message, ...(problem.line !== undefined ? { line: problem.line } : {}) })),
      `${fileName} was not saved: fix ${result.problems.length === 1 ? 'the problem' : 'the problems'} listed, then upload it again.`,
    );
  }
  return { fileName, cards: result.cards, checksum: createHash('sha256').update(file.bytes).digest('hex') };
}

/**
 * Reads a library file and stores every card in it, or none: 400 with each problem's line,
 * 409 when a card's name is taken in the project. Answers the stored cards.
 */
export async function uploadDeviceModels(dataSource: DataSource, actor: Viewer, projectId: number, file: UploadedModelFile): Promise<DeviceModelView[]> {
  await projectFor(dataSource, actor, projectId, 'devices:write');
  const { fileName, cards, checksum } = readUploadedLibrary(file);
  const uploadedAt = new Date().toISOString();
  return dataSource.transaction(async (manager) => {
    // PostgreSQL: uploads to one project's library one after the other, so a name taken meanwhile answers 409.
    await lockRowForUpdate(manager, ProjectEntity, projectId);
    const repository = manager.getRepository(DeviceModelEntity);
    const taken = await repository.find({ where: { projectId, nameKey: In(cards.map((card) => card.name.toLowerCase())) } });
    if (taken.length > 0) {
      const byKey = new Map(taken.map((row) => [row.nameKey, row]));
      const details = cards
        .filter((card) => byKey.has(card.name.toLowerCase()))
        .map((card) => {
          const row = byKey.get(card.name.toLowerCase()) as DeviceModel;
          return {
            path: '/file',
            line: card.line,
            message: `${card.name} is already in this project's library (from ${row.fileName}); to change its text, replace that card (specs that recorded it keep the old text), or give the changed card a new name.`,
          };
        });
      throw new AppError('device-model-exists', 409, `${fileName} was not saved: ${details.length === 1 ? 'a model name is' : `${details.length} model names are`} already in the library.`, details);
    }
    await checkLibraryQuota(manager, projectId, cards.length, fileName);
    const saved: DeviceModel[] = [];
    for (const card of cards) {
      const row = await repository.save(libraryRow(projectId, card, { fileName, checksum, uploadedById: actor.id, uploadedAt }));
      await recordEvent(manager, { actorId: actor.id, action: 'device-model.added', entityType: 'device-model', entityId: row.id, projectId, afterId: row.id, details: { name: card.name, fileName, checksum } });
      saved.push(row);
    }
    return views(manager, saved);
  });
}

const thousands = (n: number) => n.toLocaleString('en-GB');

/**
 * The library quota (DEVICE_LIBRARY_QUOTA) for `adding` new cards, of which `joining` enter the
 * library (a replacement adds a version but keeps the library's count): 409
 * `device-library-full` when the library or the stored versions are at their limit, 413
 * `device-library-quota-exceeded` when this file's cards would pass one (fewer may fit).
 */
async function checkLibraryQuota(manager: EntityManager, projectId: number, adding: number, fileName: string, joining = adding): Promise<void> {
  const repository = manager.getRepository(DeviceModelEntity);
  const [inLibrary, versions] = [await repository.countBy({ projectId, retirement: IsNull() }), await repository.countBy({ projectId })];
  const { cards, versions: maxVersions } = DEVICE_LIBRARY_QUOTA;
  const remove = 'Remove the cards no spec needs any more (Device library, Remove), or keep other parts in another project.';
  if (joining > 0 && inLibrary >= cards) {
    throw new AppError('device-library-full', 409, `${fileName} was not saved: this project's device library holds ${thousands(inLibrary)} cards, the most it holds (${thousands(cards)}). ${remove}`, [
      { path: '/file', message: `the library holds at most ${thousands(cards)} cards` },
    ]);
  }
  if (versions >= maxVersions) {
    throw new AppError(
      'device-library-full',
      409,
      `${fileName} was not saved: this project has kept ${thousands(versions)} card texts (in the library, replaced and removed), the most it keeps (${thousands(maxVersions)}). Replaced and removed cards stay readable for the specs that recorded them; keep further parts in another project.`,
      [{ path: '/file', message: `the project keeps at most ${thousands(maxVersions)} card texts` }],
    );
  }
  if (inLibrary + joining > cards || versions + adding > maxVersions) {
    const room = Math.max(0, Math.min(cards - inLibrary, maxVersions - versions));
    throw new AppError(
      'device-library-quota-exceeded',
      413,
      `${fileName} was not saved: its ${thousands(adding)} cards would take this project's device library past ${inLibrary + joining > cards ? `${thousands(cards)} cards (${thousands(inLibrary)} in it)` : `${thousands(maxVersions)} stored card texts (${thousands(versions)} kept)`}; there is room for ${thousands(room)}. Upload fewer cards, or ${remove.charAt(0).toLowerCase()}${remove.slice(1)}`,
      [{ path: '/file', message: `has ${thousands(adding)} cards; the library has room for ${thousands(room)}` }],
    );
  }
}

/** The card of the project by id, locked with the project; 404 outside it; 409 when it has already left the library. */
async function libraryCardRow(manager: EntityManager, projectId: number, deviceId: number, doing: string): Promise<DeviceModel> {
  await lockRowForUpdate(manager, ProjectEntity, projectId);
  const row = await manager.getRepository(DeviceModelEntity).findOneBy({ id: deviceId, projectId });
  if (!row) throw notFound('device-model');
  if (row.retirement !== null) {
    const current = row.retirement === 'replaced' && row.replacedById !== null ? ` (its replacement is card #${row.replacedById})` : '';
    throw new AppError('device-model-retired', 409, `${row.name} was ${row.retirement} on ${row.retiredAt ?? 'an earlier date'}${current}, so it cannot be ${doing}; it stays readable for the specs that recorded it.`);
  }
  return row;
}

/** Takes the card out of the library: it stays readable, marked removed; its name is free again. */
async function retire(manager: EntityManager, row: DeviceModel, actor: Viewer, retirement: 'removed' | 'replaced', at: string): Promise<DeviceModel> {
  return manager.getRepository(DeviceModelEntity).save({ ...row, nameKey: `~${row.id}`, retiredAt: at, retiredById: actor.id, retirement });
}

/**
 * Removes a card from the project's library (`devices:write`): the row is kept, marked removed,
 * so specs that recorded it still read its text; the name can be uploaded again. 404 outside
 * the viewer's projects, 409 when it has already left the library.
 */
export async function removeDeviceModel(dataSource: DataSource, actor: Viewer, projectId: number, deviceId: number): Promise<void> {
  await projectFor(dataSource, actor, projectId, 'devices:write');
  await dataSource.transaction(async (manager) => {
    const row = await libraryCardRow(manager, projectId, deviceId, 'removed');
    await retire(manager, row, actor, 'removed', new Date().toISOString());
    await recordEvent(manager, {
      actorId: actor.id,
      action: 'device-model.removed',
      entityType: 'device-model',
      entityId: row.id,
      projectId,
      beforeId: row.id,
      details: { name: row.name, fileName: row.fileName, checksum: row.checksum },
    });
  });
}

/**
 * Replaces a library card's text with the one card of an uploaded file, named as the card
 * (any case): the old card is kept, marked replaced and pointing at the new one, so specs that
 * recorded it still read the text they were filled from. 400 for a bad file, a file of several
 * cards or of another name; 409 when the text is the stored one or the card has left the
 * library; the quota of stored texts applies. Answers the new card and the replaced one.
 */
export async function replaceDeviceModel(dataSource: DataSource, actor: Viewer, projectId: number, deviceId: number, file: UploadedModelFile): Promise<{ item: DeviceModelView; replaced: DeviceModelView }> {
  await projectFor(dataSource, actor, projectId, 'devices:write');
  const { fileName, cards, checksum } = readUploadedLibrary(file);
  return dataSource.transaction(async (manager) => {
    const old = await libraryCardRow(manager, projectId, deviceId, 'replaced');
    if (cards.length !== 1) {
      throw invalid(
        [{ path: '/file', message: `holds ${cards.length} cards; a replacement file holds one card, named ${old.name}` }],
        `${fileName} was not saved: a replacement is one card.`,
      );
    }
    const [card] = cards;
    if (card.name.toLowerCase() !== old.nameKey) {
      throw invalid(
        [{ path: '/file', line: card.line, message: `the card is named ${card.name}; a replacement keeps the name ${old.name} (upload a card of another name to add it instead)` }],
        `${fileName} was not saved: it does not replace ${old.name}.`,
      );
    }
    if (checksum === old.checksum || card.text === old.cardText) {
      throw new AppError('device-model-unchanged', 409, `${fileName} was not saved: its card is the stored text of ${old.name}, so there is nothing to replace.`, [
        { path: '/file', line: card.line, message: `is the same card as the library's ${old.name}` },
      ]);
    }
    await checkLibraryQuota(manager, projectId, 1, fileName, 0);
    const at = new Date().toISOString();
    const retired = await retire(manager, old, actor, 'replaced', at);
    const repository = manager.getRepository(DeviceModelEntity);
    const saved = await repository.save({
      ...libraryRow(projectId, card, { fileName, checksum, uploadedById: actor.id, uploadedAt: at }),
      retiredAt: null,
      retiredById: null,
      retirement: null,
      replacedById: null,
    });
    const replaced = await repository.save({ ...retired, replacedById: saved.id });
    await recordEvent(manager, {
      actorId: actor.id,
      action: 'device-model.replaced',
      entityType: 'device-model',
      entityId: saved.id,
      projectId,
      beforeId: old.id,
      afterId: saved.id,
      details: { name: card.name, fileName, checksum, previousFileName: old.fileName, previousChecksum: old.checksum },
    });
    const [item, before] = await views(manager, [saved, replaced]);
    return { item, replaced: before };
  });
}

/** What a design's netlists take from the library card its spec was filled from. */
export interface DesignCard {
  /** Texts of comment lines for `spiceNetlist`'s header: the card, or why it is not used. */
  comments: string[];
  /**
   * The card's parameters the design's device does not carry, for `spiceNetlist`'s
   * `spiceOnlyParameters`: SPICE simulates them, the engine does not model them. Empty when the
   * spec names no card or the design's device is no longer the card's.
   */
  spiceOnlyParameters: Record<string, number>;
  /** The card's name when the design is the card's device, else null. */
  cardName: string | null;
}

/** Whether a design's device is the card's: IS, BF, VAF equal, and every parameter of its `model` the card's. */
function deviceIsCard(device: DeviceParams, parameters: Readonly<Record<string, number>>): boolean {
  const card = cardDevice(parameters);
  if (card.beta !== device.beta || card.saturationCurrentA !== device.saturationCurrentA || card.earlyVoltageV !== (device.earlyVoltageV ?? 0)) return false;
  const model = (device as { model?: Record<string, number> }).model ?? {};
  return Object.entries(model).every(([name, value]) => parameters[name] === value);
}

/**
 * The library card a spec names (`deviceModel`), for a design's netlists: every parameter of the
 * card SPICE reads that the design's device does not carry goes into the netlist's `.model` card
 * (the whole card is simulated), and the header comments name the card. Nothing when the spec
 * names no card; a one-line note when the card is gone from the library or the design's device is
 * no longer the card's (then the design's own values alone are simulated).
 */
export async function designCard(manager: EntityManager | DataSource, projectId: number, specPayload: unknown, device: DeviceParams): Promise<DesignCard> {
  const none = (comments: string[]): DesignCard => ({ comments, spiceOnlyParameters: {}, cardName: null });
  const reference = (specPayload as { deviceModel?: { name?: unknown; checksum?: unknown } } | null)?.deviceModel;
  if (!reference || typeof reference.name !== 'string' || typeof reference.checksum !== 'string') return none([]);
  const row = await recordedRow(manager, projectId, { name: reference.name, checksum: reference.checksum });
  if (!row) return none([`The spec names library card ${reference.name}, which this project's library has never held from that file.`]);
  if (!deviceIsCard(device, row.parameters)) {
    return none([`The spec was filled from library card ${row.name} (file ${row.fileName}), but this design's device differs from the card's; the card is not simulated with it.`]);
  }
  const carried = new Set(['IS', 'BF', 'VAF', ...Object.keys((device as { model?: Record<string, number> }).model ?? {})]);
  const spiceOnlyParameters: Record<string, number> = {};
  for (const [name, value] of Object.entries({ ...cardModel(row.parameters), ...cardSpiceOnlyParameters(row.parameters) })) {
    if (!carried.has(name) && value !== undefined) spiceOnlyParameters[name] = value;
  }
  const state = stateOf(row);
  const retired = state === 'library' ? [] : [`(This card has since been ${state} in the project's library; below is the text the spec was filled from.)`];
  const origin: CardOrigin = { name: row.name, fileName: row.fileName, checksum: row.checksum, text: row.cardText };
  return { comments: [...retired, ...cardCommentLines(origin, Object.keys(spiceOnlyParameters))], spiceOnlyParameters, cardName: row.name };
}
