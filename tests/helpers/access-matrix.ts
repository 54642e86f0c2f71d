/**
 * The role × route matrix as data, shared by tests/api/access-matrix.test.ts and the reliability
 * run (tests/reliability/access-control.ts): every route of app.ts called by nobody and by each
 * role, the expected status written out per cell. The table is PERMISSIONS
 * (shared/workflow/roles.ts) plus each route's documented rule: public, signed in, or one action;
 * and for records, the project ("own": every non-admin role is a member; "other": none is, so
 * 404 — the admin reads all). arrangeMatrix puts each proposal in the state where the allowed
 * role succeeds, so a cell measures the access decision; the two "state" rows show the role
 * check still comes before the 409.
 */
import { ApiTokenEntity } from '../../api/entities/api-token.entity';
import { createApiToken } from '../../api/services/api-tokens.service';
import { DeviceModelEntity } from '../../api/entities/device-model.entity';
import { uploadDeviceModels } from '../../api/services/devices.service';
import { ProposalEntity } from '../../api/entities/proposal.entity';
import { VerificationJobEntity } from '../../api/entities/verification-job.entity';
import { uploadMeasurement } from '../../api/services/measurements.service';
import { addMember } from '../../api/services/projects.service';
import { decide, review } from '../../api/services/proposals.service';
import { postComment } from '../../api/services/comments.service';
import { ProposalCommentEntity } from '../../api/entities/proposal-comment.entity';
import type { CommentInput } from '#shared/api/comments';
import { updateSpec } from '../../api/services/specs.service';
import type { PublicUser } from '../../api/services/users.service';
import type { Action } from '#shared/workflow/roles';
import { In, IsNull, Not } from 'typeorm';
import { registeredRoutes as listRoutes } from '../../api/openapi';
import { emailOf, specPayload, TEST_PASSWORD, type TestApi } from './api-app';

/** A designer's own values for the evaluation rows (invented; a simple mirror on ±9 V). */
const EVALUATED_DESIGN = {
  device: { family: 'npn', beta: 140, earlyVoltageV: 70, saturationCurrentA: 9e-15 },
  supply: { positiveV: 9, negativeV: -9 },
  collectorResistanceOhm: 5110,
  tail: { topology: 'simple-mirror', referenceResistanceOhm: 15800 },
};

export const CALLERS = ['anonymous', 'admin', 'requirements', 'designer', 'reviewer'] as const;
export type Caller = (typeof CALLERS)[number];
export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

/** Ids the URLs and bodies refer to, filled in by arrangeMatrix. */
export interface Ids {
  project: number;
  otherProject: number;
  spec: number;
  otherSpec: number;
  /** own project: the spec the edit and ranking rows write to (a newer ranked version would supersede the proposals of {spec}) */
  editableSpec: number;
  /** own project, status ranked: the designer's decision succeeds */
  ranked: number;
  /** own project, decided by the designer: the reviewer's review succeeds */
  decided: number;
  /** own project, approved: no decision or review is allowed */
  approved: number;
  /** own project, ranked: a review is not allowed yet */
  rankedForReview: number;
  /** own project, ranked, asked for by the requirements account: withdrawn by its author or a designer (put back to ranked before each cell) */
  withdrawable: number;
  /** other project, decided by the second designer */
  otherProposal: number;
  reviewer2: number;
  designer2: number;
  /** a bench measurement of the approved proposal, and one of the other project's proposal */
  measurement: number;
  otherMeasurement: number;
  /** a device card in each project (restored into the library before each cell that replaces or removes it) */
  device: number;
  otherDevice: number;
  /** the sha256 of the file both cards came from (a spec's record of them) */
  deviceChecksum: string;
  /** a personal API token of the designer (put back unrevoked before each cell) */
  designerToken: number;
  /** a Monte Carlo job asked for by the second designer on {ranked}, and one on {otherProposal}: each withdraw cell finds it waiting or simulating */
  withdrawableJob: number;
  otherWithdrawableJob: number;
  /** a comment thread on {ranked} by the reviewer, and one on {otherProposal} by the second designer (reopened before each resolve cell) */
  comment: number;
  otherComment: number;
}

export interface Row {
  /** The route as app.ts registers it (checked against the app's router below). */
  route: `${Method} /api${string}`;
  /** The URL called, `{name}` filled from Ids. */
  url: string;
  /** public | signed-in | an action of PERMISSIONS | per-record (the record's own people decide: see the row's note). */
  rule: 'public' | 'signed-in' | 'per-record' | Action;
  /** Expected status for anonymous, admin, requirements, designer, reviewer. */
  expected: [number, number, number, number, number];
  body?: (ids: Ids, caller: Caller) => object;
  /** A file sent as multipart/form-data in the field `file` instead of a JSON body. */
  file?: { name: string; content: string };
  /** Runs before the cell (idempotent). */
  arrange?: (api: TestApi, ids: Ids) => Promise<void>;
  /** The cell gets a session of its own (sign-in and sign-out change the session). */
  fresh?: boolean;
  note?: string;
}

const newSpec = () => ({ title: 'Quillon sensor head — matrix spec', payload: specPayload() });
/** One invented spec as an import file (the same each time, so a repeated import changes nothing). */
const IMPORT_FILE = { name: 'matrix.csv', content: 'title,supply.positiveV,supply.negativeV,gain.target,cmrr.minDb\r\nQuillon sensor head — imported,9,-9,14,70\r\n' };
/** One invented .model card; each cell first removes it, so every allowed upload is a first one. */
const DEVICE_FILE = { name: 'matrix.lib', content: '.model FH-MATRIX NPN (IS=6f BF=140 VAF=70)\n' };
/** An invented bench measurement (rejection against frequency); the same bytes each time, so one stored file. */
const MEASUREMENT_FILE = { name: 'matrix-bench.csv', content: 'frequency_hz,cmrr_db\n100,80\n1000,74\n' };
const removeMatrixDevice = async (api: TestApi) => {
  await api.dataSource.getRepository(DeviceModelEntity).delete({ nameKey: 'fh-matrix' });
};
/** The card every replace and remove cell acts on, and the replacement text those cells send. */
const LIBRARY_CARD = { name: 'matrix-card.lib', content: '.model FH-MATRIX-R NPN (IS=6f BF=140 VAF=70)\n' };
const REPLACEMENT_CARD = { name: 'matrix-card-2.lib', content: '.model FH-MATRIX-R NPN (IS=6f BF=150 VAF=72)\n' };
/** Puts the card `{key}` back into its library as uploaded (its replacements deleted), so each allowed cell succeeds once. */
const restoreMatrixCard = (key: 'device' | 'otherDevice') => async (api: TestApi, ids: Ids) => {
  const repository = api.dataSource.getRepository(DeviceModelEntity);
  const card = await repository.findOneByOrFail({ id: ids[key] });
  await repository.delete({ projectId: card.projectId, name: card.name, retirement: IsNull(), id: Not(card.id) });
  await repository.update({ id: card.id }, { nameKey: card.name.toLowerCase(), retirement: null, retiredAt: null, retiredById: null, replacedById: null });
};
/** The withdrawal cells each find the proposal open again (idempotent). */
const reopenWithdrawable = async (api: TestApi, ids: Ids) => {
  await api.dataSource.getRepository(ProposalEntity).update({ id: ids.withdrawable }, { status: 'ranked', closedReason: null, closedById: null, closedAt: null });
};
/** A Monte Carlo job of 2,000 runs by the second designer (long enough to be still running when the cell calls). */
const withdrawableJob = (api: TestApi, proposalId: number) =>
  api.dataSource.getRepository(VerificationJobEntity).save({
    proposalId,
    kind: 'monte-carlo' as const,
    topology: 'wilson',
    runs: 2000,
    state: 'waiting' as const,
    done: 0,
    total: 2000,
    step: null,
    message: null,
    result: null,
    requestedById: api.users.designer2.id,
    claimToken: null,
    heartbeatAt: null,
    createdAt: new Date().toISOString(),
    startedAt: null,
    finishedAt: null,
  });
/** Puts a withdrawn job back to waiting (same id), so every cell finds one to withdraw. */
const rearmJob = (key: 'withdrawableJob' | 'otherWithdrawableJob') => async (api: TestApi, ids: Ids) => {
  await api.dataSource
    .getRepository(VerificationJobEntity)
    .update({ id: ids[key], state: In(['withdrawn', 'finished', 'stopped', 'failed']) }, { state: 'waiting', message: null, finishedAt: null, claimToken: null, step: null });
};
/** The resolve cells each find the thread open (idempotent). */
const reopenComment = (key: 'comment' | 'otherComment') => async (api: TestApi, ids: Ids) => {
  await api.dataSource.getRepository(ProposalCommentEntity).update({ id: ids[key] }, { resolvedAt: null, resolvedById: null });
};
/** A comment on the rejection figure of the first ranked option (the same each time). */
const matrixComment = () => ({ anchorKind: 'figure', topology: 'simple-mirror', figureKey: 'rejection', body: 'Matrix: is this corner the governing one?' });
const unrevokeToken = async (api: TestApi, ids: Ids) => {
  await api.dataSource.getRepository(ApiTokenEntity).update({ id: ids.designerToken }, { revokedAt: null });
};
const ensureReviewer2Member = (key: 'project' | 'otherProject') => async (api: TestApi, ids: Ids) => {
  await addMember(api.dataSource, api.users.admin, ids[key], ids.reviewer2, 'reviewer');
};

export const MATRIX: Row[] = [
  // Public: no sign-in, every caller the same.
  { route: 'GET /api/health', url: '/api/health', rule: 'public', expected: [200, 200, 200, 200, 200] },
  { route: 'GET /api/schema/spec', url: '/api/schema/spec', rule: 'public', expected: [200, 200, 200, 200, 200] },
  { route: 'GET /api/schema/design', url: '/api/schema/design', rule: 'public', expected: [200, 200, 200, 200, 200] },
  { route: 'GET /api/schema/spec.csv', url: '/api/schema/spec.csv', rule: 'public', expected: [200, 200, 200, 200, 200] },
  { route: 'GET /api/openapi.json', url: '/api/openapi.json', rule: 'public', expected: [200, 200, 200, 200, 200] },
  { route: 'GET /api/topologies', url: '/api/topologies', rule: 'public', expected: [200, 200, 200, 200, 200] },
  { route: 'GET /api/auth/csrf', url: '/api/auth/csrf', rule: 'public', expected: [200, 200, 200, 200, 200] },
  {
    route: 'POST /api/auth/login',
    url: '/api/auth/login',
    rule: 'public',
    fresh: true,
    body: (_ids, caller) => ({ email: emailOf(caller === 'anonymous' ? 'reviewer2' : caller), password: TEST_PASSWORD }),
    expected: [200, 200, 200, 200, 200],
  },
  { route: 'POST /api/auth/logout', url: '/api/auth/logout', rule: 'public', fresh: true, expected: [204, 204, 204, 204, 204], note: 'signing out without a session is harmless' },
  { route: 'GET /api/auth/me', url: '/api/auth/me', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'PATCH /api/auth/me', url: '/api/auth/me', rule: 'signed-in', body: () => ({ notify: true }), expected: [401, 200, 200, 200, 200], note: 'own e-mail preference' },
  {
    route: 'POST /api/auth/password',
    url: '/api/auth/password',
    rule: 'signed-in',
    body: () => ({ currentPassword: 'not-the-current-password', newPassword: 'moss-granary-5521-tide' }),
    expected: [401, 400, 400, 400, 400],
    note: 'own password; a wrong current password, so the passwords stay: 400 means the access check let it through',
  },
  {
    route: 'POST /api/auth/password-reset',
    url: '/api/auth/password-reset',
    rule: 'public',
    body: () => ({ token: 'no-such-reset-link-token-0000', newPassword: 'moss-granary-5521-tide' }),
    expected: [400, 400, 400, 400, 400],
    note: 'anyone holding a link; an unknown token answers 400 reset-link-invalid',
  },
  { route: 'GET /api/auth/tokens', url: '/api/auth/tokens', rule: 'signed-in', expected: [401, 200, 200, 200, 200], note: 'own personal API tokens' },
  {
    route: 'POST /api/auth/tokens',
    url: '/api/auth/tokens',
    rule: 'signed-in',
    body: (_ids, caller) => ({ name: `matrix ${caller}` }),
    expected: [401, 201, 201, 201, 201],
    note: 'a token of your own (a session is needed: tests/api/api-tokens.test.ts)',
  },
  {
    route: 'DELETE /api/auth/tokens/:id',
    url: '/api/auth/tokens/{designerToken}',
    rule: 'per-record',
    arrange: unrevokeToken,
    expected: [401, 404, 404, 200, 404],
    note: 'only its owner (the designer) revokes a token; anyone else’s is not found',
  },

  // Accounts: the admin only.
  { route: 'GET /api/users', url: '/api/users', rule: 'users:manage', expected: [401, 200, 403, 403, 403] },
  {
    route: 'POST /api/users',
    url: '/api/users',
    rule: 'users:manage',
    body: (_ids, caller) => ({ email: `matrix-${caller}@tests.longtail.test`, displayName: 'Matrix account', role: 'member', password: 'moss-granary-5521' }),
    expected: [401, 201, 403, 403, 403],
  },
  { route: 'PATCH /api/users/:id', url: '/api/users/{reviewer2}', rule: 'users:manage', body: () => ({ displayName: 'Second reviewer (renamed)' }), expected: [401, 200, 403, 403, 403] },
  { route: 'PATCH /api/users/:id', url: '/api/users/{reviewer2}', rule: 'users:manage', body: () => ({ disabled: false }), expected: [401, 200, 403, 403, 403], note: 'enable (already enabled: nothing changes)' },
  { route: 'POST /api/users/:id/password-reset', url: '/api/users/{reviewer2}/password-reset', rule: 'users:manage', expected: [401, 202, 403, 403, 403], note: 'a one-time link mailed through the outbox' },

  // Administration: the local mail server's messages.
  { route: 'GET /api/admin/mail', url: '/api/admin/mail', rule: 'mail:read', expected: [401, 200, 403, 403, 403] },

  // Projects.
  { route: 'GET /api/projects', url: '/api/projects', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'POST /api/projects', url: '/api/projects', rule: 'projects:create', body: () => ({ name: 'Matrix project' }), expected: [401, 201, 403, 403, 403] },
  { route: 'GET /api/projects/:id', url: '/api/projects/{project}', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/projects/:id', url: '/api/projects/{otherProject}', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'GET /api/projects/:id/members', url: '/api/projects/{project}/members', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/projects/:id/members', url: '/api/projects/{otherProject}/members', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'POST /api/projects/:id/members', url: '/api/projects/{project}/members', rule: 'members:manage', body: (ids) => ({ userId: ids.reviewer2, role: 'reviewer' }), expected: [401, 201, 403, 403, 403] },
  { route: 'POST /api/projects/:id/members', url: '/api/projects/{otherProject}/members', rule: 'members:manage', body: (ids) => ({ userId: ids.reviewer2, role: 'reviewer' }), expected: [401, 201, 403, 403, 403] },
  { route: 'DELETE /api/projects/:id/members/:userId', url: '/api/projects/{project}/members/{reviewer2}', rule: 'members:manage', arrange: ensureReviewer2Member('project'), expected: [401, 204, 403, 403, 403] },
  { route: 'DELETE /api/projects/:id/members/:userId', url: '/api/projects/{otherProject}/members/{reviewer2}', rule: 'members:manage', arrange: ensureReviewer2Member('otherProject'), expected: [401, 204, 403, 403, 403] },
  { route: 'GET /api/projects/:id/specs', url: '/api/projects/{project}/specs', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/projects/:id/specs', url: '/api/projects/{otherProject}/specs', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'POST /api/projects/:id/specs', url: '/api/projects/{project}/specs', rule: 'specs:write', body: newSpec, expected: [401, 403, 201, 403, 403] },
  { route: 'POST /api/projects/:id/specs', url: '/api/projects/{otherProject}/specs', rule: 'specs:write', body: newSpec, expected: [401, 403, 404, 403, 403] },
  { route: 'GET /api/projects/:id/proposals', url: '/api/projects/{project}/proposals', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/projects/:id/proposals', url: '/api/projects/{otherProject}/proposals', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'GET /api/projects/:id/activity', url: '/api/projects/{project}/activity', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/projects/:id/activity', url: '/api/projects/{otherProject}/activity', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'GET /api/projects/:id/activity.csv', url: '/api/projects/{project}/activity.csv', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/projects/:id/activity.csv', url: '/api/projects/{otherProject}/activity.csv', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },

  // What waits for the signed-in person, across their own projects (nothing of anyone else's).
  { route: 'GET /api/waiting/counts', url: '/api/waiting/counts', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/waiting', url: '/api/waiting?kind=decide', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  // The one search: signed in; it only ever answers from the caller's own projects (and the people in them).
  { route: 'GET /api/search', url: '/api/search?q=quillon', rule: 'signed-in', expected: [401, 200, 200, 200, 200], note: 'only what each may see: tests/api/search.test.ts' },
  { route: 'GET /api/projects/:projectId/devices', url: '/api/projects/{project}/devices', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/projects/:projectId/devices', url: '/api/projects/{otherProject}/devices', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'POST /api/projects/:projectId/devices', url: '/api/projects/{project}/devices', rule: 'devices:write', file: DEVICE_FILE, arrange: removeMatrixDevice, expected: [401, 403, 201, 201, 403] },
  { route: 'POST /api/projects/:projectId/devices', url: '/api/projects/{otherProject}/devices', rule: 'devices:write', file: DEVICE_FILE, arrange: removeMatrixDevice, expected: [401, 403, 404, 404, 403] },
  { route: 'GET /api/projects/:projectId/devices/recorded', url: '/api/projects/{project}/devices/recorded?name=FH-MATRIX-R&checksum={deviceChecksum}', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/projects/:projectId/devices/recorded', url: '/api/projects/{otherProject}/devices/recorded?name=FH-MATRIX-R&checksum={deviceChecksum}', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'GET /api/projects/:projectId/devices/:deviceId', url: '/api/projects/{project}/devices/{device}', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/projects/:projectId/devices/:deviceId', url: '/api/projects/{otherProject}/devices/{otherDevice}', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  {
    route: 'PUT /api/projects/:projectId/devices/:deviceId',
    url: '/api/projects/{project}/devices/{device}',
    rule: 'devices:write',
    file: REPLACEMENT_CARD,
    arrange: restoreMatrixCard('device'),
    expected: [401, 403, 200, 200, 403],
  },
  {
    route: 'PUT /api/projects/:projectId/devices/:deviceId',
    url: '/api/projects/{otherProject}/devices/{otherDevice}',
    rule: 'devices:write',
    file: REPLACEMENT_CARD,
    arrange: restoreMatrixCard('otherDevice'),
    expected: [401, 403, 404, 404, 403],
  },
  { route: 'DELETE /api/projects/:projectId/devices/:deviceId', url: '/api/projects/{project}/devices/{device}', rule: 'devices:write', arrange: restoreMatrixCard('device'), expected: [401, 403, 204, 204, 403] },
  {
    route: 'DELETE /api/projects/:projectId/devices/:deviceId',
    url: '/api/projects/{otherProject}/devices/{otherDevice}',
    rule: 'devices:write',
    arrange: restoreMatrixCard('otherDevice'),
    expected: [401, 403, 404, 404, 403],
  },
  { route: 'POST /api/projects/:id/specs/import', url: '/api/projects/{project}/specs/import', rule: 'specs:write', file: IMPORT_FILE, expected: [401, 403, 200, 403, 403] },
  { route: 'POST /api/projects/:id/specs/import', url: '/api/projects/{otherProject}/specs/import', rule: 'specs:write', file: IMPORT_FILE, expected: [401, 403, 404, 403, 403] },
  { route: 'GET /api/projects/:id/proposals.csv', url: '/api/projects/{project}/proposals.csv?ids={ranked}', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/projects/:id/proposals.csv', url: '/api/projects/{otherProject}/proposals.csv?ids={otherProposal}', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },

  // Specs.
  { route: 'GET /api/specs/:id', url: '/api/specs/{spec}', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/specs/:id', url: '/api/specs/{otherSpec}', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'PUT /api/specs/:id', url: '/api/specs/{editableSpec}', rule: 'specs:write', body: newSpec, expected: [401, 403, 200, 403, 403] },
  { route: 'PUT /api/specs/:id', url: '/api/specs/{otherSpec}', rule: 'specs:write', body: newSpec, expected: [401, 403, 404, 403, 403] },
  { route: 'GET /api/specs/:id/versions', url: '/api/specs/{spec}/versions', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/specs/:id/versions', url: '/api/specs/{otherSpec}/versions', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'GET /api/specs/:id/diff', url: '/api/specs/{spec}/diff?from=1&to=2', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/specs/:id/diff', url: '/api/specs/{otherSpec}/diff?from=1&to=2', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'POST /api/specs/:id/proposals', url: '/api/specs/{editableSpec}/proposals', rule: 'proposals:create', expected: [401, 403, 201, 201, 403] },
  { route: 'POST /api/specs/:id/proposals', url: '/api/specs/{otherSpec}/proposals', rule: 'proposals:create', expected: [401, 403, 404, 404, 403] },

  // Proposals.
  { route: 'GET /api/proposals/:id', url: '/api/proposals/{ranked}', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/proposals/:id', url: '/api/proposals/{otherProposal}', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'POST /api/proposals/:id/decision', url: '/api/proposals/{ranked}/decision', rule: 'proposals:decide', body: () => ({ kind: 'accept' }), expected: [401, 403, 403, 201, 403] },
  { route: 'POST /api/proposals/:id/decision', url: '/api/proposals/{otherProposal}/decision', rule: 'proposals:decide', body: () => ({ kind: 'accept' }), expected: [401, 403, 403, 404, 403] },
  {
    route: 'POST /api/proposals/:id/decision',
    url: '/api/proposals/{approved}/decision',
    rule: 'proposals:decide',
    body: () => ({ kind: 'accept' }),
    expected: [401, 403, 403, 409, 403],
    note: 'state: approved',
  },
  { route: 'POST /api/proposals/:id/evaluation', url: '/api/proposals/{ranked}/evaluation', rule: 'proposals:decide', body: () => ({ design: EVALUATED_DESIGN }), expected: [401, 403, 403, 200, 403] },
  { route: 'POST /api/proposals/:id/evaluation', url: '/api/proposals/{otherProposal}/evaluation', rule: 'proposals:decide', body: () => ({ design: EVALUATED_DESIGN }), expected: [401, 403, 403, 404, 403] },
  { route: 'POST /api/proposals/:id/review', url: '/api/proposals/{decided}/review', rule: 'proposals:review', body: () => ({ verdict: 'approve' }), expected: [401, 403, 403, 403, 201] },
  { route: 'POST /api/proposals/:id/review', url: '/api/proposals/{otherProposal}/review', rule: 'proposals:review', body: () => ({ verdict: 'approve' }), expected: [401, 403, 403, 403, 404] },
  {
    route: 'POST /api/proposals/:id/review',
    url: '/api/proposals/{rankedForReview}/review',
    rule: 'proposals:review',
    body: () => ({ verdict: 'approve' }),
    expected: [401, 403, 403, 403, 409],
    note: 'state: ranked',
  },
  {
    route: 'POST /api/proposals/:id/withdrawal',
    url: '/api/proposals/{withdrawable}/withdrawal',
    rule: 'proposals:withdraw',
    body: () => ({ reason: 'Ranked on the wrong spec.' }),
    arrange: reopenWithdrawable,
    expected: [401, 403, 201, 201, 403],
    note: 'asked for by the requirements account, so its author may withdraw it (a non-author: tests/api/spec-lifecycle.test.ts)',
  },
  {
    route: 'POST /api/proposals/:id/withdrawal',
    url: '/api/proposals/{otherProposal}/withdrawal',
    rule: 'proposals:withdraw',
    body: () => ({ reason: 'Ranked on the wrong spec.' }),
    expected: [401, 403, 404, 404, 403],
  },
  { route: 'GET /api/proposals/:id/audit', url: '/api/proposals/{ranked}/audit', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/proposals/:id/ranking.csv', url: '/api/proposals/{ranked}/ranking.csv', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/proposals/:id/ranking.csv', url: '/api/proposals/{otherProposal}/ranking.csv', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'GET /api/proposals/:id/netlist.cir', url: '/api/proposals/{ranked}/netlist.cir', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/proposals/:id/netlist.cir', url: '/api/proposals/{otherProposal}/netlist.cir', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'GET /api/proposals/:id/export.json', url: '/api/proposals/{ranked}/export.json', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/proposals/:id/export.json', url: '/api/proposals/{otherProposal}/export.json', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'GET /api/proposals/:proposalId/measurements', url: '/api/proposals/{approved}/measurements', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/proposals/:proposalId/measurements', url: '/api/proposals/{otherProposal}/measurements', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'POST /api/proposals/:proposalId/measurements', url: '/api/proposals/{approved}/measurements', rule: 'measurements:write', file: MEASUREMENT_FILE, expected: [401, 403, 403, 201, 201] },
  { route: 'POST /api/proposals/:proposalId/measurements', url: '/api/proposals/{otherProposal}/measurements', rule: 'measurements:write', file: MEASUREMENT_FILE, expected: [401, 403, 403, 404, 404] },
  { route: 'GET /api/proposals/:proposalId/measurements/:measurementId', url: '/api/proposals/{approved}/measurements/{measurement}', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  {
    route: 'GET /api/proposals/:proposalId/measurements/:measurementId',
    url: '/api/proposals/{otherProposal}/measurements/{otherMeasurement}',
    rule: 'signed-in',
    expected: [401, 200, 404, 404, 404],
  },
  {
    route: 'GET /api/proposals/:proposalId/measurements/:measurementId/file',
    url: '/api/proposals/{approved}/measurements/{measurement}/file',
    rule: 'signed-in',
    expected: [401, 200, 200, 200, 200],
  },
  {
    route: 'GET /api/proposals/:proposalId/measurements/:measurementId/file',
    url: '/api/proposals/{otherProposal}/measurements/{otherMeasurement}/file',
    rule: 'signed-in',
    expected: [401, 200, 404, 404, 404],
  },
  { route: 'GET /api/proposals/:id/verification', url: '/api/proposals/{ranked}/verification', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/proposals/:id/verification', url: '/api/proposals/{otherProposal}/verification', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'POST /api/proposals/:id/verification', url: '/api/proposals/{ranked}/verification', rule: 'proposals:verify', expected: [401, 403, 403, 202, 202] },
  { route: 'POST /api/proposals/:id/verification', url: '/api/proposals/{otherProposal}/verification', rule: 'proposals:verify', expected: [401, 403, 403, 404, 404] },
  {
    route: 'POST /api/proposals/:id/verification/monte-carlo',
    url: '/api/proposals/{ranked}/verification/monte-carlo',
    rule: 'proposals:verify',
    body: () => ({ topology: 'wilson', runs: 10 }),
    expected: [401, 403, 403, 202, 202],
  },
  {
    route: 'POST /api/proposals/:id/verification/monte-carlo',
    url: '/api/proposals/{otherProposal}/verification/monte-carlo',
    rule: 'proposals:verify',
    body: () => ({ topology: 'wilson', runs: 10 }),
    expected: [401, 403, 403, 404, 404],
  },
  {
    route: 'DELETE /api/proposals/:id/verification/:jobId',
    url: '/api/proposals/{ranked}/verification/{withdrawableJob}',
    rule: 'per-record',
    arrange: rearmJob('withdrawableJob'),
    expected: [401, 200, 403, 403, 200],
    note: 'withdrawing a job: its requester (here the second designer), a reviewer or an administrator',
  },
  {
    route: 'DELETE /api/proposals/:id/verification/:jobId',
    url: '/api/proposals/{otherProposal}/verification/{otherWithdrawableJob}',
    rule: 'per-record',
    arrange: rearmJob('otherWithdrawableJob'),
    expected: [401, 200, 404, 404, 404],
  },
  { route: 'GET /api/proposals/:id/audit', url: '/api/proposals/{otherProposal}/audit', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'GET /api/proposals/:id/comments', url: '/api/proposals/{ranked}/comments', rule: 'signed-in', expected: [401, 200, 200, 200, 200] },
  { route: 'GET /api/proposals/:id/comments', url: '/api/proposals/{otherProposal}/comments', rule: 'signed-in', expected: [401, 200, 404, 404, 404] },
  { route: 'POST /api/proposals/:id/comments', url: '/api/proposals/{ranked}/comments', rule: 'proposals:comment', body: matrixComment, expected: [401, 403, 403, 201, 201] },
  { route: 'POST /api/proposals/:id/comments', url: '/api/proposals/{otherProposal}/comments', rule: 'proposals:comment', body: matrixComment, expected: [401, 403, 403, 404, 404] },
  {
    route: 'POST /api/proposals/:id/comments/:commentId/replies',
    url: '/api/proposals/{ranked}/comments/{comment}/replies',
    rule: 'proposals:comment',
    body: () => ({ body: 'Matrix reply.' }),
    expected: [401, 403, 403, 201, 201],
  },
  {
    route: 'POST /api/proposals/:id/comments/:commentId/replies',
    url: '/api/proposals/{otherProposal}/comments/{otherComment}/replies',
    rule: 'proposals:comment',
    body: () => ({ body: 'Matrix reply.' }),
    expected: [401, 403, 403, 404, 404],
  },
  {
    route: 'PATCH /api/proposals/:id/comments/:commentId',
    url: '/api/proposals/{ranked}/comments/{comment}',
    rule: 'proposals:comment',
    arrange: reopenComment('comment'),
    body: () => ({ resolved: true }),
    expected: [401, 403, 403, 200, 200],
  },
  {
    route: 'PATCH /api/proposals/:id/comments/:commentId',
    url: '/api/proposals/{otherProposal}/comments/{otherComment}',
    rule: 'proposals:comment',
    arrange: reopenComment('otherComment'),
    body: () => ({ resolved: true }),
    expected: [401, 403, 403, 404, 404],
  },

  // Stateless what-if.
  { route: 'POST /api/analyze', url: '/api/analyze', rule: 'signed-in', body: () => ANALYZE_DESIGN, expected: [401, 200, 200, 200, 200] },
  { route: 'POST /api/tradeoff', url: '/api/tradeoff', rule: 'signed-in', body: () => ({ spec: specPayload(), topology: 'simple-mirror', tailCurrentsA: [2e-4, 1e-3] }), expected: [401, 200, 200, 200, 200] },
];

/** A small invented design for the what-if route (a Wilson tail on ±9 V rails). */
const ANALYZE_DESIGN = {
  device: { family: 'npn', beta: 180, earlyVoltageV: 72, saturationCurrentA: 9e-15 },
  supply: { positiveV: 9, negativeV: -9 },
  collectorResistanceOhm: 2260,
  pairEmitterResistanceOhm: 82.5,
  tail: { topology: 'wilson', referenceResistanceOhm: 26700 },
};

/**
 * The records the matrix's URLs name, made through the services on a fresh app: a project with
 * every non-admin account as a member in its usual role, and one with only the second designer
 * and reviewer, a spec in each (two versions), and proposals in the states the rows need. The
 * other project's spec is written by the second reviewer as that project's systems engineer,
 * who then becomes its reviewer (roles are per project; the services check them too).
 */
export async function arrangeMatrix(api: TestApi): Promise<Ids> {
  const { dataSource, users, ruleSet } = api;
  const project = await api.createProject(['requirements', 'designer', 'reviewer', 'designer2', 'reviewer2'], 'Quillon sensor head');
  const otherProject = await api.createProject(['designer2', 'reviewer2'], 'Sallow tide gauge', { reviewer2: 'requirements' });
  const spec = await api.createSpec(project.id);
  const editableSpec = await api.createSpec(project.id, { title: 'Quillon sensor head — spare channel' });
  const otherSpec = await api.createSpec(otherProject.id, { by: 'reviewer2', title: 'Sallow tide gauge — pressure bridge pair' });
  const revised = { ...specPayload(), powerBudgetW: 0.028 };
  await updateSpec(dataSource, users.requirements, spec.id, { title: 'Quillon sensor head — thermopile input pair', payload: revised });
  await updateSpec(dataSource, users.reviewer2, otherSpec.id, { title: 'Sallow tide gauge — pressure bridge pair', payload: revised });
  await addMember(dataSource, users.admin, otherProject.id, users.reviewer2.id, 'reviewer');

  const ranked = await api.createProposal(spec.id);
  const decided = await api.createProposal(spec.id);
  await decide(dataSource, users.designer, decided.id, { kind: 'accept' }, ruleSet);
  const approved = await api.createProposal(spec.id);
  await decide(dataSource, users.designer, approved.id, { kind: 'accept' }, ruleSet);
  await review(dataSource, users.reviewer, approved.id, { verdict: 'approve' });
  const rankedForReview = await api.createProposal(spec.id);
  const withdrawable = await api.createProposal(spec.id, 'requirements');
  const otherProposal = await api.createProposal(otherSpec.id, 'designer2');
  await decide(dataSource, users.designer2, otherProposal.id, { kind: 'accept' }, ruleSet);
  const measured = (proposalId: number, by: PublicUser) =>
    uploadMeasurement(dataSource, api.app.uploadsDir, by, proposalId, { originalName: MEASUREMENT_FILE.name, bytes: Buffer.from(MEASUREMENT_FILE.content, 'utf8') }, null);
  const measurement = await measured(approved.id, users.designer);
  const otherMeasurement = await measured(otherProposal.id, users.designer2);
  const card = (projectId: number, by: PublicUser) =>
    uploadDeviceModels(dataSource, by, projectId, { originalName: LIBRARY_CARD.name, bytes: Buffer.from(LIBRARY_CARD.content, 'utf8') }).then(([stored]) => stored);
  const device = await card(project.id, users.designer);
  const otherDevice = await card(otherProject.id, users.designer2);
  const job = await withdrawableJob(api, ranked.id);
  const otherJob = await withdrawableJob(api, otherProposal.id);
  const designerToken = await createApiToken(dataSource, users.designer.id, { name: 'matrix designer script' });
  const comment = await postComment(dataSource, users.reviewer, ranked.id, matrixComment() as CommentInput);
  const otherComment = await postComment(dataSource, users.designer2, otherProposal.id, matrixComment() as CommentInput);

  return {
    project: project.id,
    otherProject: otherProject.id,
    spec: spec.id,
    otherSpec: otherSpec.id,
    editableSpec: editableSpec.id,
    ranked: ranked.id,
    decided: decided.id,
    approved: approved.id,
    rankedForReview: rankedForReview.id,
    withdrawable: withdrawable.id,
    otherProposal: otherProposal.id,
    reviewer2: users.reviewer2.id,
    designer2: users.designer2.id,
    measurement: measurement.id,
    otherMeasurement: otherMeasurement.id,
    device: device.id,
    otherDevice: otherDevice.id,
    deviceChecksum: device.checksum,
    withdrawableJob: job.id,
    otherWithdrawableJob: otherJob.id,
    designerToken: designerToken.id,
    comment: comment.id,
    otherComment: otherComment.id,
  };
}

/** The row's URL with `{name}` filled from the ids. */
export const fillUrl = (url: string, ids: Ids) => url.replace(/\{(\w+)\}/g, (_m, key: keyof Ids) => String(ids[key]));

/** The (method, path) pairs the app registers, read from Express 5's router (api/openapi.ts). */
export function registeredRoutes(app: TestApi['app']): string[] {
  return [...new Set(listRoutes(app).map((route) => `${route.method.toUpperCase()} ${route.path}`))].sort();
}
