/**
 * Batch specs: many specs imported from one CSV or JSON file (checked row by row before anything
 * is written, then the valid rows saved in one transaction with their audit events), and the
 * results of a batch's proposals as one CSV.
 *
 * Re-importing is idempotent. A row whose title matches a spec of the project is compared with
 * that spec's latest version (both with the schema's defaults filled in): the same document is
 * "unchanged" and writes nothing; a different one becomes the spec's next version. A title no
 * spec of the project has creates a spec. A title two specs of the project share is refused on
 * that row (which of them was meant is not for the server to guess).
 */
import { In, type DataSource, type EntityManager } from 'typeorm';
import type { Spec as SpecDocument } from '#shared/engine/types';
import { batchResultsCsv } from '#shared/export/batch-csv';
import type { ImportAction, ImportReport, ImportRowReport } from '#shared/import/import-report';
import { readSpecFile } from '#shared/import/spec-file';
import { diffJson } from '#shared/json-diff';
import { decodeUploadText } from '#shared/text/upload-text';
import { ProposalEntity } from '../entities/proposal.entity';
import { SpecVersionEntity } from '../entities/spec-version.entity';
import { SpecEntity, type Spec } from '../entities/spec.entity';
import { lockRowForUpdate } from '../data-source';
import { invalid, notFound } from '../errors';
import { recordEvent } from './audit.service';
import { projectFor } from './projects.service';
import { insertSpec, insertSpecVersion, latestVersion } from './specs.service';
import { rankingsOf } from './rankings.service';
import type { PublicUser } from './users.service';

type Viewer = Pick<PublicUser, 'id' | 'role'>;

/** The uploaded file as multer hands it over. */
export interface ImportFile {
  buffer: Buffer;
  originalName: string;
  mimeType: string;
}

/** The report the route answers (shared/import/import-report.ts). */
export type { ImportAction, ImportReport, ImportRowReport };

/**
 * UTF-8 text of the upload (the one upload check, `shared/text/upload-text.ts`); a binary file or
 * another encoding is refused. Control characters are left to the row checks, which name the cell.
 */
function fileText(file: ImportFile): string {
  const decoded = decodeUploadText(file.buffer, { controls: 'keep' });
  if (decoded.ok) return decoded.text;
  if (decoded.problem.kind === 'not-utf8') {
    throw invalid([{ path: '/file', message: 'is not UTF-8 text: save the sheet as "CSV UTF-8" or the specs as JSON' }], 'The file cannot be read.');
  }
  throw invalid([{ path: '/file', message: 'is not a text file (CSV or JSON)' }], 'The file cannot be read.');
}

/**
 * Checks every row of the file and, unless `dryRun`, saves the valid ones in one transaction:
 * each new spec or version with its own audit event, and one `specs.imported` event for the file.
 */
export async function importSpecs(dataSource: DataSource, actor: Viewer, projectId: number, file: ImportFile, options: { dryRun: boolean }): Promise<ImportReport> {
  await projectFor(dataSource, actor, projectId, 'specs:write');
  const reading = readSpecFile({ text: fileText(file), fileName: file.originalName, mimeType: file.mimeType });
  if (!reading.ok) throw invalid([{ path: '/file', message: reading.message }], 'The file cannot be read.');
  const fileName = file.originalName.slice(0, 200);
  const run = async (manager: EntityManager): Promise<ImportReport> => {
    if (!options.dryRun) await projectFor(manager, actor, projectId, 'specs:write');
    const existing = await specsByTitle(manager, projectId);
    const rows: ImportRowReport[] = [];
    for (const parsed of reading.rows) {
      const errors = [...parsed.errors];
      const matches = parsed.title === null ? [] : (existing.get(parsed.title) ?? []);
      if (parsed.document && matches.length > 1) {
        errors.push({ row: parsed.row, field: 'title', message: `matches ${matches.length} specs of this project (ids ${matches.map((s) => s.id).join(', ')}); rename one of them to import this row` });
      }
      if (!parsed.document || errors.length > 0) {
        rows.push({ row: parsed.row, title: parsed.title, ok: false, errors, action: 'skipped', specId: null, version: null });
        continue;
      }
      rows.push(await landRow(manager, actor, projectId, matches[0], parsed.row, parsed.document, options.dryRun, fileName));
    }
    const counts: Record<ImportAction, number> = { created: 0, 'new-version': 0, unchanged: 0, skipped: 0 };
    for (const row of rows) counts[row.action] += 1;
    if (!options.dryRun) {
      await recordEvent(manager, {
        actorId: actor.id,
        action: 'specs.imported',
        entityType: 'project',
        entityId: projectId,
        projectId,
        details: { fileName, format: reading.format, rows: rows.length, ...counts },
      });
    }
    return { fileName, format: reading.format, dryRun: options.dryRun, total: rows.length, valid: rows.filter((r) => r.ok).length, counts, headerErrors: reading.headerErrors, rows };
  };
  return options.dryRun ? run(dataSource.manager) : dataSource.transaction(run);
}

/** The project's specs by (trimmed) title. */
async function specsByTitle(manager: EntityManager, projectId: number): Promise<Map<string, Spec[]>> {
  const specs = await manager.getRepository(SpecEntity).find({ where: { projectId }, order: { id: 'ASC' } });
  const byTitle = new Map<string, Spec[]>();
  for (const spec of specs) byTitle.set(spec.title.trim(), [...(byTitle.get(spec.title.trim()) ?? []), spec]);
  return byTitle;
}

/** One valid row: created, a new version, or unchanged; written unless this is a dry run. */
async function landRow(manager: EntityManager, actor: Viewer, projectId: number, match: Spec | undefined, row: number, document: SpecDocument, dryRun: boolean, fileName: string): Promise<ImportRowReport> {
  const base = { row, title: document.title, ok: true, errors: [] };
  const source = { import: { fileName, row } };
  if (!match) {
    if (dryRun) return { ...base, action: 'created', specId: null, version: null };
    const { spec } = await insertSpec(manager, actor, projectId, document.title, document, source);
    return { ...base, action: 'created', specId: spec.id, version: 1 };
  }
  if (!dryRun) {
    // PostgreSQL: an edit of the same spec under way commits first; read its latest version after it.
    await lockRowForUpdate(manager, SpecEntity, match.id);
    match = await manager.getRepository(SpecEntity).findOneByOrFail({ id: match.id });
  }
  const previous = await latestVersion(manager, match);
  if (diffJson(previous.payload, document).length === 0) return { ...base, action: 'unchanged', specId: match.id, version: match.latestVersion };
  if (dryRun) return { ...base, action: 'new-version', specId: match.id, version: match.latestVersion + 1 };
  const { spec } = await insertSpecVersion(manager, actor, match, previous, document.title, document, source);
  return { ...base, action: 'new-version', specId: match.id, version: spec.latestVersion };
}

/** Proposals one batch CSV may list. */
export const MAX_BATCH_PROPOSALS = 1000;

/**
 * The results of the given proposals of a project as CSV, in the order asked; an id that is not
 * a proposal of this project (or not visible) answers 404, like any record outside one's projects.
 */
export async function batchProposalsCsv(dataSource: DataSource, viewer: Viewer, projectId: number, ids: readonly number[]): Promise<string> {
  await projectFor(dataSource, viewer, projectId);
  const unique = [...new Set(ids)];
  const proposals = await dataSource.getRepository(ProposalEntity).find({
    select: { id: true, specVersionId: true, status: true, rankingId: true, projectId: true },
    where: { id: In(unique), projectId },
  });
  if (proposals.length !== unique.length) throw notFound('proposal');
  const versions = await dataSource.getRepository(SpecVersionEntity).find({
    select: { id: true, version: true, title: true },
    where: { id: In([...new Set(proposals.map((p) => p.specVersionId))]) },
  });
  const versionById = new Map(versions.map((v) => [v.id, v]));
  const proposalById = new Map(proposals.map((p) => [p.id, p]));
  const results = await rankingsOf(dataSource, proposals);
  return batchResultsCsv(
    unique.map((id) => {
      const proposal = proposalById.get(id)!;
      const version = versionById.get(proposal.specVersionId)!;
      return { specTitle: version.title, specVersion: version.version, proposalId: id, status: proposal.status, result: results.get(proposal.rankingId)! };
    }),
  );
}
