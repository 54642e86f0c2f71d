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
import type { RecommendResult } from '../../shared/engine/recommend';
import { compareMeasurement, measurementReference } from '../../shared/measurements/comparison';
import { readMeasurementFile, type MeasuredPoint, type MeasurementKind, type MeasurementUnit } from '../../shared/measurements/measurement-csv';
import type { MeasurementView } from '../../shared/measurements/types';
import type { ProposalVerificationResult } from '../../shared/verification/types';
import type { ProposalState } from '../../shared/workflow/proposal-states';
import { DecisionEntity, type Decision } from '../entities/decision.entity';
import { MeasurementEntity, type Measurement } from '../entities/measurement.entity';
import type { Proposal } from '../entities/proposal.entity';
import { SpecVersionEntity } from '../entities/spec-version.entity';
import { UserEntity } from '../entities/user.entity';
import { VerificationJobEntity } from '../entities/verification-job.entity';
import { AppError, invalid, notFound } from '../errors';
import { recordEvent } from './audit.service';
import { safeFileName } from './devices.service';
import { proposalFor } from './proposals.service';
import type { PublicUser } from './users.service';

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
  const spec = JSON.parse(version.payload) as { gain?: { output?: string }; cmrr?: { atFrequencyHz?: number } };
  const verification = job?.state === 'finished' && job.result ? (JSON.parse(job.result) as ProposalVerificationResult) : null;
  return {
    proposal,
    result: JSON.parse(proposal.result) as RecommendResult,
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
    decision: { kind: decision.kind, topology: decision.topology, evaluation: decision.evaluation ? JSON.parse(decision.evaluation) : null },
    output: context.output,
    verification: context.verification,
  });
}

function view(row: Measurement, context: ProposalContext, names: Map<number, string>): MeasurementView {
  const points = JSON.parse(row.points) as MeasuredPoint[];
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
    points,
    note: row.note,
    uploadedBy: { id: row.uploadedById, displayName: names.get(row.uploadedById) ?? `user #${row.uploadedById}` },
    uploadedAt: row.uploadedAt,
    comparison: compareMeasurement({ kind, unit, points, specFrequencyHz: context.specFrequencyHz, reference: referenceFor(context, row.decisionId) }),
  };
}

async function views(manager: EntityManager | DataSource, rows: Measurement[], context: ProposalContext): Promise<MeasurementView[]> {
  const ids = [...new Set(rows.map((row) => row.uploadedById))];
  const users = ids.length > 0 ? await manager.getRepository(UserEntity).find({ select: { id: true, displayName: true }, where: { id: In(ids) } }) : [];
  const names = new Map(users.map((user) => [user.id, user.displayName]));
  return rows.map((row) => view(row, context, names));
}

/** The proposal's measurements, oldest first, each with its comparison. */
export async function listMeasurements(dataSource: DataSource, viewer: Viewer, proposalId: number): Promise<MeasurementView[]> {
  const proposal = await proposalFor(dataSource, viewer, proposalId);
  const rows = await dataSource.getRepository(MeasurementEntity).find({ where: { proposalId }, order: { id: 'ASC' } });
  return views(dataSource, rows, await contextOf(dataSource, proposal));
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
  const sha256 = createHash('sha256').update(file.bytes).digest('hex');
  // The bytes first, then the row: a failed transaction leaves at most an unreferenced file,
  // named by its content, which the next upload of the same bytes reuses; never a row without its file.
  await storeBytes(uploadsDir, sha256, file.bytes);
  return dataSource.transaction(async (manager) => {
    // Read again inside the transaction: the decision in force is the one measured.
    const current = await proposalFor(manager, actor, proposalId, 'measurements:write');
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
      points: JSON.stringify(read.points),
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
