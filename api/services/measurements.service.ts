/**
 * Bench measurements of a decided proposal: an uploaded CSV of rejection or gain against frequency
 * (shared/measurements/measurement-csv.ts) is checked, its bytes kept in the uploads directory
 * under their sha256 (the same content is stored once), its points and metadata in the
 * `measurement` table with an audit event in the same transaction; each measurement is shown
 * with its difference from the decided design's prediction (and SPICE simulation) at the spec
 * frequency (shared/measurements/comparison.ts).
 */
import { createHash, randomBytes } from 'node:crypto';
import { mkdir, readFile, rename, stat, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { In, type DataSource, type EntityManager } from 'typeorm';
import type { RecommendResult } from '#shared/engine/recommend';
import { compareMeasurement, measurementReference } from '#shared/measurements/comparison';
import { readMeasurementFile, type MeasuredPoint, type MeasurementKind, type MeasurementUnit } from '#shared/measurements/measurement-csv';
import { MEASUREMENT_QUOTA, type MeasurementSummary, type MeasurementView } from '#shared/measurements/types';
import type { ProposalVerificationResult } from '#shared/verification/types';
import type { ProposalState } from '#shared/workflow/proposal-states';
import { DecisionEntity, type Decision } from '../entities/decision.entity';
import { MeasurementEntity, type Measurement } from '../entities/measurement.entity';
import { ProposalEntity, type Proposal } from '../entities/proposal.entity';
import { ProjectEntity } from '../entities/project.entity';
import { lockRowForUpdate } from '../data-source';
import { SpecVersionEntity } from '../entities/spec-version.entity';
import { UserEntity } from '../entities/user.entity';
import { VerificationJobEntity } from '../entities/verification-job.entity';
import { AppError, invalid, notFound } from '../errors';
import { recordEvent } from './audit.service';
import { safeFileName } from './devices.service';
import { proposalFor } from './proposals.service';
import { rankingOf } from './rankings.service';
import type { PublicUser } from './users.service';
import type { Page } from '#shared/api/lists';
import type { MeasurementListQuery } from '#shared/api/measurements';

type Viewer = Pick<PublicUser, 'id' | 'role'>;

/** States with a decision in force: a design exists to be built and measured. */
export const MEASURABLE_STATES: readonly ProposalState[] = ['decided', 'returned', 'approved'];

export interface UploadedMeasurementFile {
  originalName: string;
  bytes: Uint8Array;
}

/** Everything a comparison needs from the proposal, read once per request. */
interface ProposalContext {
  proposal: Proposal;
  result: RecommendResult;
  decisions: Decision[];
  output: 'differential' | 'single-ended';
  specFrequencyHz: number;
  verification: ProposalVerificationResult | null;
}

async function contextOf(manager: EntityManager | DataSource, proposal: Proposal): Promise<ProposalContext> {
  // One after another: inside a transaction these share one connection, which must not overlap queries.
  const version = await manager.getRepository(SpecVersionEntity).findOneByOrFail({ id: proposal.specVersionId });
  const decisions = await manager.getRepository(DecisionEntity).find({ where: { proposalId: proposal.id }, order: { id: 'ASC' } });
  const job = await manager.getRepository(VerificationJobEntity).findOne({ where: { proposalId: proposal.id, kind: 'proposal' }, order: { id: 'DESC' } });
  const spec = version.payload as { gain?: { output?: string }; cmrr?: { atFrequencyHz?: number } };
  const verification = job?.state === 'finished' && job.result ? (job.result as ProposalVerificationResult) : null;
  return {
    proposal,
    result: await rankingOf(manager, proposal),
    decisions,
    output: spec.gain?.output === 'single-ended' ? 'single-ended' : 'differential',
    specFrequencyHz: spec.cmrr?.atFrequencyHz ?? 0,
    verification: verification && Array.isArray(verification.options) ? verification : null,
  };
}

function referenceFor(context: ProposalContext, decisionId: number) {
  const decision = context.decisions.find((d) => d.id === decisionId);
  if (!decision) return null;
  return measurementReference({
    options: context.result.options,
    decision: { kind: decision.kind, topology: decision.topology, evaluation: decision.evaluation },
    output: context.output,
    verification: context.verification,
  });
}

function summary(row: Measurement, points: MeasuredPoint[], context: ProposalContext, names: Map<number, string>): MeasurementSummary {
  const kind = row.kind as MeasurementKind;
  const unit = row.unit as MeasurementUnit;
  return {
    id: row.id,
    proposalId: row.proposalId,
    decisionId: row.decisionId,
    topology: row.topology,
    designSource: row.designSource,
    kind,
    unit,
    fileName: row.fileName,
    sha256: row.sha256,
    sizeBytes: row.sizeBytes,
    pointCount: row.pointCount,
    note: row.note,
    uploadedBy: { id: row.uploadedById, displayName: names.get(row.uploadedById) ?? `user #${row.uploadedById}` },
    uploadedAt: row.uploadedAt,
    comparison: compareMeasurement({ kind, unit, points, specFrequencyHz: context.specFrequencyHz, reference: referenceFor(context, row.decisionId) }),
  };
}

async function uploaderNames(manager: EntityManager | DataSource, rows: Measurement[]): Promise<Map<number, string>> {
  const ids = [...new Set(rows.map((row) => row.uploadedById))];
  const users = ids.length > 0 ? await manager.getRepository(UserEntity).find({ select: { id: true, displayName: true }, where: { id: In(ids) } }) : [];
  return new Map(users.map((user) => [user.id, user.displayName]));
}

/** Full views, the points included (one measurement, the upload's answer, export.json). */
async function views(manager: EntityManager | DataSource, rows: Measurement[], context: ProposalContext): Promise<MeasurementView[]> {
  const names = await uploaderNames(manager, rows);
  return rows.map((row) => {
    return { ...summary(row, row.points, context, names), points: row.points };
  });
}

/**
 * One page of the proposal's measurements, newest first, each with its comparison but without
 * its points (they are served one measurement at a time): `{ items, total, page, pageSize }`.
 */
export async function listMeasurements(dataSource: DataSource, viewer: Viewer, proposalId: number, query: MeasurementListQuery): Promise<Page<MeasurementSummary>> {
  const proposal = await proposalFor(dataSource, viewer, proposalId);
  const repository = dataSource.getRepository(MeasurementEntity);
  const [total, rows] = await Promise.all([
    repository.countBy({ proposalId }),
    repository.find({ where: { proposalId }, order: { id: 'DESC' }, skip: (query.page - 1) * query.pageSize, take: query.pageSize }),
  ]);
  const context = await contextOf(dataSource, proposal);
  const names = await uploaderNames(dataSource, rows);
  // The points are read here only for the comparison; the quota bounds them (MEASUREMENT_QUOTA.proposal.points).
  const items = rows.map((row) => summary(row, row.points, context, names));
  return { items, total, page: query.page, pageSize: query.pageSize };
}

/** One measurement of a visible proposal with its points and comparison. */
export async function getMeasurement(dataSource: DataSource, viewer: Viewer, proposalId: number, measurementId: number): Promise<MeasurementView> {
  const proposal = await proposalFor(dataSource, viewer, proposalId);
  const row = await dataSource.getRepository(MeasurementEntity).findOneBy({ id: measurementId, proposalId });
  if (!row) throw notFound('measurement');
  const [shown] = await views(dataSource, [row], await contextOf(dataSource, proposal));
  return shown;
}

/** Every measurement of a visible proposal with its points, oldest first (export.json; bounded by the quota). */
export async function allMeasurements(dataSource: DataSource, viewer: Viewer, proposalId: number): Promise<MeasurementView[]> {
  const proposal = await proposalFor(dataSource, viewer, proposalId);
  const rows = await dataSource.getRepository(MeasurementEntity).find({ where: { proposalId }, order: { id: 'ASC' } });
  return views(dataSource, rows, await contextOf(dataSource, proposal));
}

/** What a proposal (or a project) holds already: measurements, points and bytes. */
interface Stored {
  count: number;
  points: number;
  bytes: number;
}

async function storedIn(manager: EntityManager | DataSource, where: { proposalId: number } | { projectId: number }): Promise<Stored> {
  const query = manager
    .getRepository(MeasurementEntity)
    .createQueryBuilder('m')
    .select('COUNT(*)', 'count')
    .addSelect('COALESCE(SUM(m.pointCount), 0)', 'points')
    .addSelect('COALESCE(SUM(m.sizeBytes), 0)', 'bytes');
  if ('proposalId' in where) query.where('m.proposalId = :proposalId', { proposalId: where.proposalId });
  else query.innerJoin(ProposalEntity.options.name, 'p', 'p.id = m.proposalId').where('p.projectId = :projectId', { projectId: where.projectId });
  const raw = (await query.getRawOne()) as { count: unknown; points: unknown; bytes: unknown } | undefined;
  return { count: Number(raw?.count ?? 0), points: Number(raw?.points ?? 0), bytes: Number(raw?.bytes ?? 0) };
}

const thousands = (n: number) => n.toLocaleString('en-GB');
/** Sizes in KB (rounded up) below 10 MB, so a total and the room left read in the same unit; whole MB as the limits are stated. */
const sizeText = (bytes: number) => (bytes >= 10 * 1024 * 1024 || (bytes >= 1024 * 1024 && bytes % (1024 * 1024) === 0) ? `${thousands(Math.round((bytes / (1024 * 1024)) * 10) / 10)} MB` : `${thousands(Math.ceil(bytes / 1024))} KB`);

/**
 * The quotas (MEASUREMENT_QUOTA): 409 `measurement-quota-full` when the proposal or the project
 * already holds as many measurements as it keeps; 413 `measurement-quota-exceeded` when this file
 * would take its points or bytes past a total (a smaller file may still fit). The message names
 * the limit and what to do.
 */
function checkQuota(scope: 'proposal' | 'project', stored: Stored, adding: { points: number; bytes: number }): void {
  const quota = MEASUREMENT_QUOTA[scope];
  const holder = scope === 'proposal' ? 'This proposal' : "This proposal's project";
  const elsewhere =
    scope === 'proposal'
      ? 'Measurements stay with the proposal as part of its record; put further sweeps of this build into fewer, thinner files, or measure a revised build on a new proposal.'
      : 'Measurements stay with their proposals as part of the record; thin new sweeps (a few hundred points cover a rejection curve), or ask an administrator to start a new project for further builds.';
  if (stored.count >= quota.count) {
    throw new AppError('measurement-quota-full', 409, `${holder} already holds ${thousands(stored.count)} bench measurements, the most it keeps (${thousands(quota.count)}). ${elsewhere}`, [
      { path: '/file', message: `the ${scope}'s measurement quota is ${thousands(quota.count)} files` },
    ]);
  }
  if (stored.points + adding.points > quota.points) {
    const room = Math.max(0, quota.points - stored.points);
    throw new AppError(
      'measurement-quota-exceeded',
      413,
      `This file's ${thousands(adding.points)} points would take ${scope === 'proposal' ? 'this proposal' : "the proposal's project"} past its ${thousands(quota.points)} measured points (${thousands(stored.points)} stored, room for ${thousands(room)}). Upload a sweep of at most ${thousands(room)} points. ${elsewhere}`,
      [{ path: '/file', message: `has ${thousands(adding.points)} points; the ${scope} has room for ${thousands(room)}` }],
    );
  }
  if (stored.bytes + adding.bytes > quota.bytes) {
    const room = Math.max(0, quota.bytes - stored.bytes);
    throw new AppError(
      'measurement-quota-exceeded',
      413,
      `This file (${sizeText(adding.bytes)}) would take ${scope === 'proposal' ? 'this proposal' : "the proposal's project"} past its ${sizeText(quota.bytes)} of measurement files (${sizeText(stored.bytes)} stored, room for ${sizeText(room)}). Upload a smaller file (drop comment lines or thin the sweep). ${elsewhere}`,
      [{ path: '/file', message: `is ${sizeText(adding.bytes)}; the ${scope} has room for ${sizeText(room)}` }],
    );
  }
}

/** Both quotas, the proposal's first. */
async function checkQuotas(manager: EntityManager | DataSource, proposal: Pick<Proposal, 'id' | 'projectId'>, adding: { points: number; bytes: number }): Promise<void> {
  checkQuota('proposal', await storedIn(manager, { proposalId: proposal.id }), adding);
  checkQuota('project', await storedIn(manager, { projectId: proposal.projectId }), adding);
}

/** The path of a stored file: the uploads directory and the content's sha256 (64 hex digits, nothing else). */
function storedPath(uploadsDir: string, sha256: string): string {
  if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error('not a sha256');
  return join(uploadsDir, sha256);
}

/** Writes the bytes under their sha256 unless that file exists (written whole, then renamed into place). */
async function storeBytes(uploadsDir: string, sha256: string, bytes: Uint8Array): Promise<void> {
  const path = storedPath(uploadsDir, sha256);
  await mkdir(uploadsDir, { recursive: true });
  const existing = await stat(path).catch(() => null);
  if (existing?.isFile() && existing.size === bytes.length) return;
  const temporary = join(uploadsDir, `.${sha256}.${randomBytes(6).toString('hex')}.part`);
  await writeFile(temporary, bytes, { mode: 0o640 });
  await rename(temporary, path);
}

/**
 * Checks and stores an uploaded measurement of the decided design: 404 outside the viewer's
 * projects, 409 while nothing is decided, 400 with each problem's line for a bad file (nothing
 * stored). Answers the stored measurement with its comparison.
 */
export async function uploadMeasurement(
  dataSource: DataSource,
  uploadsDir: string,
  actor: Viewer,
  proposalId: number,
  file: UploadedMeasurementFile,
  note: string | null,
): Promise<MeasurementView> {
  const proposal = await proposalFor(dataSource, actor, proposalId, 'measurements:write');
  if (!MEASURABLE_STATES.includes(proposal.status)) {
    throw new AppError(
      'not-decided',
      409,
      `Proposal ${proposal.id} is ${proposal.status}: nothing is decided yet, so there is no design to measure. Bench measurements are uploaded once a designer has decided.`,
    );
  }
  const fileName = safeFileName(file.originalName);
  const read = readMeasurementFile(file.bytes);
  if (!read.ok) {
    throw invalid(
      read.problems.map((problem) => ({ path: '/file', message: problem.message, ...(problem.line !== undefined ? { line: problem.line } : {}) })),
      `${fileName} was not saved: fix ${read.problems.length === 1 ? 'the problem' : 'the problems'} listed, then upload it again.`,
    );
  }
  const adding = { points: read.points.length, bytes: file.bytes.length };
  // Checked before the bytes are written (a full proposal stores nothing), and again under the lock.
  await checkQuotas(dataSource, proposal, adding);
  const sha256 = createHash('sha256').update(file.bytes).digest('hex');
  // The bytes first, then the row: a failed transaction leaves at most an unreferenced file,
  // named by its content, which the next upload of the same bytes reuses; never a row without its file.
  await storeBytes(uploadsDir, sha256, file.bytes);
  return dataSource.transaction(async (manager) => {
    // Read again inside the transaction: the decision in force is the one measured. PostgreSQL:
    // uploads to one project one after the other, so two at once cannot both pass the quota.
    await lockRowForUpdate(manager, ProjectEntity, proposal.projectId);
    const current = await proposalFor(manager, actor, proposalId, 'measurements:write');
    await checkQuotas(manager, current, adding);
    const decision = await manager.getRepository(DecisionEntity).findOne({ where: { proposalId }, order: { id: 'DESC' } });
    if (!decision || !MEASURABLE_STATES.includes(current.status)) throw new AppError('not-decided', 409, `Proposal ${proposalId} has no decision in force: there is no design to measure.`);
    const row = await manager.getRepository(MeasurementEntity).save({
      proposalId,
      decisionId: decision.id,
      topology: decision.topology,
      designSource: decision.kind === 'override' ? ('decision' as const) : ('option' as const),
      kind: read.kind,
      unit: read.unit,
      fileName,
      sha256,
      sizeBytes: file.bytes.length,
      pointCount: read.points.length,
      points: read.points,
      note,
      uploadedById: actor.id,
      uploadedAt: new Date().toISOString(),
    });
    const [shown] = await views(manager, [row], await contextOf(manager, current));
    await recordEvent(manager, {
      actorId: actor.id,
      action: 'measurement.uploaded',
      entityType: 'measurement',
      entityId: row.id,
      projectId: current.projectId,
      proposalId,
      afterId: row.id,
      details: {
        kind: read.kind,
        fileName,
        sha256,
        points: read.points.length,
        topology: decision.topology,
        designSource: row.designSource,
        atFrequencyHz: shown.comparison.atFrequencyHz,
        measuredDb: shown.comparison.measuredDb,
        differenceFromPredictedDb: shown.comparison.differenceFromPredictedDb,
      },
    });
    return shown;
  });
}

/** The original bytes of one measurement of a visible proposal, and a safe download name. */
export async function measurementFile(dataSource: DataSource, uploadsDir: string, viewer: Viewer, proposalId: number, measurementId: number): Promise<{ bytes: Buffer; downloadName: string }> {
  await proposalFor(dataSource, viewer, proposalId);
  const row = await dataSource.getRepository(MeasurementEntity).findOneBy({ id: measurementId, proposalId });
  if (!row) throw notFound('measurement');
  const bytes = await readFile(storedPath(uploadsDir, row.sha256)).catch(() => null);
  if (!bytes) throw new AppError('measurement-file-not-found', 404, 'The stored file of this measurement is missing from the uploads directory.');
  return { bytes, downloadName: `longtail-measurement-${row.id}.csv` };
}
