/**
 * The device library: NPN `.model` cards uploaded per project (read by
 * shared/devices/model-card.ts), listed for the spec form's picker and the project page.
 *
 * All or nothing: a file with any problem saves nothing (400, every problem with its line). A
 * card name already in the project's library (names are case-insensitive, as in SPICE) refuses
 * the whole file with 409: stored cards are never replaced, because specs record the card they
 * were filled from (name and checksum); upload a changed card under a new name.
 */
import { createHash } from 'node:crypto';
import { In, type DataSource, type EntityManager } from 'typeorm';
import { cardCommentLines, cardDevice, cardNotes, readModelFile, type CardDevice, type CardOrigin } from '../../shared/devices/model-card';
import type { DeviceModelView } from '../../shared/devices/types';
import type { DeviceParams } from '../../shared/engine/types';
import { DeviceModelEntity, type DeviceModel } from '../entities/device-model.entity';
import { UserEntity } from '../entities/user.entity';
import { lockRowForUpdate } from '../data-source';
import { ProjectEntity } from '../entities/project.entity';
import { AppError, invalid } from '../errors';
import { recordEvent } from './audit.service';
import { projectFor } from './projects.service';
import type { PublicUser } from './users.service';

type Viewer = Pick<PublicUser, 'id' | 'role'>;

/** A library card as the API shows it (shared/devices/types.ts). */
export type { DeviceModelView };

/** The uploaded file as the route received it. */
export interface UploadedModelFile {
  originalName: string;
  bytes: Uint8Array;
}

function view(row: DeviceModel, names: Map<number, string>): DeviceModelView {
  const parameters = JSON.parse(row.parameters) as Record<string, number>;
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
    uploadedBy: { id: row.uploadedById, displayName: names.get(row.uploadedById) ?? `user #${row.uploadedById}` },
    uploadedAt: row.uploadedAt,
  };
}

async function views(manager: EntityManager | DataSource, rows: DeviceModel[]): Promise<DeviceModelView[]> {
  const ids = [...new Set(rows.map((row) => row.uploadedById))];
  const users = ids.length > 0 ? await manager.getRepository(UserEntity).findBy({ id: In(ids) }) : [];
  const names = new Map(users.map((user) => [user.id, user.displayName]));
  return rows.map((row) => view(row, names));
}

/** The project's library, by name. */
export async function listDeviceModels(dataSource: DataSource, viewer: Viewer, projectId: number): Promise<DeviceModelView[]> {
  await projectFor(dataSource, viewer, projectId);
  const rows = await dataSource.getRepository(DeviceModelEntity).find({ where: { projectId }, order: { nameKey: 'ASC', id: 'ASC' } });
  return views(dataSource, rows);
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

/**
 * Reads a library file and stores every card in it, or none: 400 with each problem's line,
 * 409 when a card's name is taken in the project. Answers the stored cards.
 */
export async function uploadDeviceModels(dataSource: DataSource, actor: Viewer, projectId: number, file: UploadedModelFile): Promise<DeviceModelView[]> {
  await projectFor(dataSource, actor, projectId, 'devices:write');
  const fileName = safeFileName(file.originalName);
  const result = readModelFile(file.bytes);
  if (!result.ok) {
    throw invalid(
      result.problems.map((problem) => ({ path: '/file', message: problem.message, ...(problem.line !== undefined ? { line: problem.line } : {}) })),
      `${fileName} was not saved: fix ${result.problems.length === 1 ? 'the problem' : 'the problems'} listed, then upload it again.`,
    );
  }
  const checksum = createHash('sha256').update(file.bytes).digest('hex');
  const uploadedAt = new Date().toISOString();
  return dataSource.transaction(async (manager) => {
    // PostgreSQL: uploads to one project's library one after the other, so a name taken meanwhile answers 409.
    await lockRowForUpdate(manager, ProjectEntity, projectId);
    const repository = manager.getRepository(DeviceModelEntity);
    const taken = await repository.find({ where: { projectId, nameKey: In(result.cards.map((card) => card.name.toLowerCase())) } });
    if (taken.length > 0) {
      const byKey = new Map(taken.map((row) => [row.nameKey, row]));
      const details = result.cards
        .filter((card) => byKey.has(card.name.toLowerCase()))
        .map((card) => {
          const row = byKey.get(card.name.toLowerCase()) as DeviceModel;
          return { path: '/file', line: card.line, message: `${card.name} is already in this project's library (from ${row.fileName}); stored cards are not replaced: give the changed card a new name.` };
        });
      throw new AppError('device-model-exists', 409, `${fileName} was not saved: ${details.length === 1 ? 'a model name is' : `${details.length} model names are`} already in the library.`, details);
    }
    const saved: DeviceModel[] = [];
    for (const card of result.cards) {
      const row = await repository.save({
        projectId,
        name: card.name,
        nameKey: card.name.toLowerCase(),
        parameters: JSON.stringify(card.parameters),
        cardText: card.text,
        sourceLine: card.line,
        fileName,
        checksum,
        uploadedById: actor.id,
        uploadedAt,
      });
      await recordEvent(manager, { actorId: actor.id, action: 'device-model.added', entityType: 'device-model', entityId: row.id, projectId, afterId: row.id, details: { name: card.name, fileName, checksum } });
      saved.push(row);
    }
    return views(manager, saved);
  });
}

/**
 * The library card a spec names (`deviceModel: { name, checksum }`), if the project still holds
 * that name from that file; null otherwise. For the exported netlist's comment.
 */
export async function libraryCardFor(manager: EntityManager | DataSource, projectId: number, reference: { name: string; checksum: string }): Promise<(CardOrigin & { device: CardDevice }) | null> {
  const row = await manager.getRepository(DeviceModelEntity).findOneBy({ projectId, nameKey: reference.name.toLowerCase() });
  if (!row || row.checksum !== reference.checksum) return null;
  return { name: row.name, fileName: row.fileName, checksum: row.checksum, text: row.cardText, device: cardDevice(JSON.parse(row.parameters) as Record<string, number>) };
}

/**
 * Texts of comment lines for an exported netlist, for `spiceNetlist`'s header comments (decision: the netlist keeps the engine's own `.model`
 * card, so SPICE solves what the engine estimated; the library card the spec was filled from
 * follows as comments, to swap in by hand). Nothing when the spec names no card; a one-line note
 * when the card is gone from the library or the design's IS, BF, VAF are no longer the card's.
 */
export async function libraryCardNetlistComment(manager: EntityManager | DataSource, projectId: number, specPayload: unknown, device: DeviceParams): Promise<string[]> {
  const reference = (specPayload as { deviceModel?: { name?: unknown; checksum?: unknown } } | null)?.deviceModel;
  if (!reference || typeof reference.name !== 'string' || typeof reference.checksum !== 'string') return [];
  const card = await libraryCardFor(manager, projectId, { name: reference.name, checksum: reference.checksum });
  if (!card) return [`The spec names library card ${reference.name}, which this project's library no longer holds from that file.`];
  const same = card.device.beta === device.beta && card.device.saturationCurrentA === device.saturationCurrentA && card.device.earlyVoltageV === (device.earlyVoltageV ?? 0);
  if (!same) return [`The spec was filled from library card ${card.name} (file ${card.fileName}), but this design's IS, BF or VAF differ from the card's; the card is not repeated here.`];
  return cardCommentLines(card);
}
