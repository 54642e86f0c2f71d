/**
 * JSON Schemas of the request bodies and queries that are not spec or design documents (those
 * have their own schemas in shared/schema). Unknown fields are refused everywhere.
 *
 * Each schema is written against its wire shape in shared/api (`wire<LoginInput>()(...)`): the
 * compiler refuses a schema whose fields are not exactly the shape's, whose `required` list is
 * not exactly the shape's required fields, or whose field schema does not fit the field's type
 * (an enum's values, string, number, boolean). Change both together.
 */
import { ACCOUNT_ROLES, PROJECT_ROLES } from '#shared/workflow/roles';
import { PROPOSAL_STATES } from '#shared/workflow/proposal-states';
import { TOPOLOGIES } from '#shared/engine/types';
import { DESIGN_SCHEMA } from '#shared/validate';
import { MONTE_CARLO_RUNS } from '#shared/verification/types';
import { WAITING_KINDS } from '#shared/workflow/waiting';
import { ACTIVITY_KINDS } from '#shared/workflow/activity';
import { NOTICE_KINDS } from '#shared/workflow/notices';
import { MIN_PASSWORD_LENGTH } from '../auth/password';
import { PLAIN_EMAIL_PATTERN, PLAIN_LINES_PATTERN, PLAIN_NAME_PATTERN } from '#shared/text/plain-text';
import type { DeviceListQuery, RecordedDeviceQuery } from '#shared/api/devices';
import type { PageQuery } from '#shared/api/lists';
import type { MeasurementListQuery } from '#shared/api/measurements';
import type { MembershipInput, NewProject } from '#shared/api/projects';
import type { DecisionInput, EvaluationInput, NetlistQuery, ProposalListQuery, ReviewInput, WithdrawalInput } from '#shared/api/proposals';
import type { DiffQuery, SpecInput } from '#shared/api/specs';
import type { ImportQuery } from '#shared/api/batch';
import type { TradeoffInput } from '#shared/api/engine';
import { TRADEOFF_SWEEP_MAX_POINTS } from '#shared/engine/tradeoff-sweep';
import type { ApiTokenInput, LoginInput, NewUser, PasswordChangeInput, PasswordResetInput, PreferencesInput, UserChanges } from '#shared/api/users';
import type { MonteCarloInput } from '#shared/api/verification';
import type { WaitingQuery } from '#shared/api/waiting';
import type { ActivityFilter, ActivityQuery } from '#shared/api/activity';
import { SEARCH_KINDS, SEARCH_QUERY_MAX_LENGTH, type SearchQuery } from '#shared/api/search';
import type { CommentInput, ReplyInput, ThreadStateInput } from '#shared/api/comments';
import { COMMENT_ANCHOR_KINDS, COMMENT_FIGURE_KEYS, COMMENT_MAX_LENGTH } from '#shared/workflow/comments';
import { wire, type Defaulted } from './wire-schema';

const email = { type: 'string', minLength: 3, maxLength: 254, pattern: PLAIN_EMAIL_PATTERN } as const;
/** A name or title: one line, not blank, no control characters or bidi overrides (shared/text/plain-text.ts). */
const name = (maxLength: number) => ({ type: 'string', minLength: 1, maxLength, pattern: PLAIN_NAME_PATTERN }) as const;
/** Multi-line text (a description, a reason, a comment): LF line ends, no other control characters or bidi overrides. */
const text = (maxLength: number) => ({ type: 'string', maxLength, pattern: PLAIN_LINES_PATTERN }) as const;

export const LOGIN_BODY = wire<LoginInput>()({ email: { type: 'string', minLength: 1, maxLength: 254 }, password: { type: 'string', minLength: 1, maxLength: 1024 } }, ['email', 'password']);

export const NEW_USER_BODY = wire<NewUser>()(
  { email, displayName: name(120), role: { enum: [...ACCOUNT_ROLES] }, password: { type: 'string', minLength: MIN_PASSWORD_LENGTH, maxLength: 1024 } },
  ['email', 'displayName', 'role', 'password'],
);

/** PATCH /api/users/:id: rename, another account role, or `disabled` true/false (admins). */
export const USER_CHANGES_BODY = { ...wire<UserChanges>()({ displayName: name(120), role: { enum: [...ACCOUNT_ROLES] }, disabled: { type: 'boolean' } }, []), minProperties: 1 };

const newPassword = { type: 'string', minLength: MIN_PASSWORD_LENGTH, maxLength: 1024 } as const;

/** POST /api/auth/password: the signed-in person's own password change. */
export const PASSWORD_CHANGE_BODY = wire<PasswordChangeInput>()({ currentPassword: { type: 'string', minLength: 1, maxLength: 1024 }, newPassword }, ['currentPassword', 'newPassword']);

/** POST /api/auth/password-reset: a new password through a one-time link's token. */
export const PASSWORD_RESET_BODY = wire<PasswordResetInput>()({ token: { type: 'string', minLength: 16, maxLength: 200, pattern: '^[A-Za-z0-9_-]{16,200}$' }, newPassword }, ['token', 'newPassword']);

/**
 * PATCH /api/auth/me: the signed-in person's own preferences, the master switch and / or the
 * whole list of notice kinds turned off (each a known kind, once).
 */
export const PREFERENCES_BODY = {
  ...wire<PreferencesInput>()({ notify: { type: 'boolean' }, noticesOff: { type: 'array', items: { enum: [...NOTICE_KINDS] }, uniqueItems: true, maxItems: NOTICE_KINDS.length } }, []),
  minProperties: 1,
};

/** POST /api/auth/tokens: a personal API token's name, one line. */
export const API_TOKEN_BODY = wire<ApiTokenInput>()({ name: name(120) }, ['name']);

export const NEW_PROJECT_BODY = wire<NewProject>()({ name: name(160), description: text(4000) }, ['name']);

/** POST /api/projects/:id/members: add the person with the role they hold in this project (or change it). */
export const MEMBERSHIP_BODY = wire<MembershipInput>()({ userId: { type: 'integer', minimum: 1 }, role: { enum: [...PROJECT_ROLES] } }, ['userId', 'role']);

/** `note`: what changed and why, optional, text like a title. The spec document itself is checked against shared/schema/spec.schema.json by the service. */
export const SPEC_BODY = wire<SpecInput>()({ title: name(200), payload: { type: 'object' }, note: name(1000) }, ['title', 'payload']);

export const DECISION_BODY = wire<DecisionInput>()(
  {
    kind: { enum: ['accept', 'choose', 'override'] },
    topology: { enum: [...TOPOLOGIES] },
    design: DESIGN_SCHEMA,
    reason: text(4000),
  },
  ['kind'],
);

/** `acceptStaleVerification`: sign off on a verification that simulated another design (with a comment; see review() in proposals.service). */
export const REVIEW_BODY = wire<ReviewInput>()({ verdict: { enum: ['approve', 'return'] }, comment: text(4000), acceptStaleVerification: { type: 'boolean' } }, ['verdict']);

/** POST /api/proposals/:id/withdrawal: why the proposal is withdrawn (multi-line text like a decision's reason; blank is refused by the service). */
export const WITHDRAWAL_BODY = wire<WithdrawalInput>()({ reason: { ...text(4000), minLength: 1 } }, ['reason']);

/** `?page=1&pageSize=20`: pages count from 1; at most 100 a page. Every paged list takes these two. */
const PAGE_FIELDS = {
  page: { type: 'integer', minimum: 1, maximum: 1000000, default: 1 },
  pageSize: { type: 'integer', minimum: 1, maximum: 100, default: 20 },
} as const;

/*
 * Query fields with a default are required in their wire shape (the checked query always has
 * them) but not in the schema (the query string may leave them out): the queries below are checked
 * against their shapes with the defaulted fields made optional (Defaulted).
 */

/**
 * GET /api/projects/:id/proposals: paged by number, or from `cursor` (the `nextCursor` of the page
 * before: the last row's created-at and id, `2026-12-04T09:00:00.000Z~123`), which reads no row
 * before it however deep the page; with a cursor the page number is not used (answered as null).
 */
export const PROPOSAL_LIST_QUERY = wire<Defaulted<ProposalListQuery, keyof PageQuery>>()(
  { status: { enum: [...PROPOSAL_STATES] }, ...PAGE_FIELDS, cursor: { type: 'string', maxLength: 48, pattern: '^\\d{4}-\\d{2}-\\d{2}T\\d{2}:\\d{2}:\\d{2}\\.\\d{3}Z~[1-9]\\d{0,14}$' } },
  [],
);

/** GET /api/waiting: one kind of what waits for the signed-in person, paged like every list (oldest first). */
export const WAITING_QUERY = wire<Defaulted<WaitingQuery, keyof PageQuery>>()({ kind: { enum: [...WAITING_KINDS] }, ...PAGE_FIELDS }, ['kind']);

/** A project's activity: `actor` keeps one person's events, `kind` one kind of event (shared/workflow/activity.ts). */
const ACTIVITY_FILTER_FIELDS = { actor: { type: 'integer', minimum: 1, maximum: 2147483647 }, kind: { enum: [...ACTIVITY_KINDS] } } as const;

/** GET /api/projects/:id/activity: paged like every list, newest first. */
export const ACTIVITY_QUERY = wire<Defaulted<ActivityQuery, keyof PageQuery>>()({ ...ACTIVITY_FILTER_FIELDS, ...PAGE_FIELDS }, []);

/** GET /api/projects/:id/activity.csv: the same filters, every event. */
export const ACTIVITY_CSV_QUERY = wire<ActivityFilter>()({ ...ACTIVITY_FILTER_FIELDS }, []);

/**
 * GET /api/search: `q` is any text up to SEARCH_QUERY_MAX_LENGTH characters (only its words are
 * searched: punctuation and operators are data); `kind` pages one kind; paged like every list.
 */
export const SEARCH_QUERY = wire<Defaulted<SearchQuery, keyof PageQuery>>()(
  { q: { type: 'string', minLength: 1, maxLength: SEARCH_QUERY_MAX_LENGTH }, kind: { enum: [...SEARCH_KINDS] }, ...PAGE_FIELDS },
  ['q'],
);

/** GET /api/proposals/:id/measurements: paged like the proposal list. */
export const MEASUREMENT_LIST_QUERY = wire<Partial<MeasurementListQuery>>()({ ...PAGE_FIELDS }, []);

/**
 * GET /api/projects/:id/devices: paged like the proposal list; `q` keeps the cards whose name
 * contains it (case-insensitive); `state=former` lists the removed and replaced cards instead.
 */
export const DEVICE_LIST_QUERY = wire<Defaulted<DeviceListQuery, 'state' | keyof PageQuery>>()(
  { q: { type: 'string', maxLength: 64 }, state: { enum: ['library', 'former'], default: 'library' }, ...PAGE_FIELDS },
  [],
);

/** GET /api/projects/:id/devices/recorded: the card a spec's `deviceModel` names. */
export const DEVICE_RECORDED_QUERY = wire<RecordedDeviceQuery>()({ name: { type: 'string', minLength: 1, maxLength: 64 }, checksum: { type: 'string', pattern: '^[0-9a-fA-F]{64}$' } }, ['name', 'checksum']);

export const DIFF_QUERY = wire<DiffQuery>()({ from: { type: 'integer', minimum: 1 }, to: { type: 'integer', minimum: 1 } }, ['from', 'to']);

export const EVALUATION_BODY = wire<EvaluationInput>()({ design: DESIGN_SCHEMA }, ['design']);

/**
 * POST /api/tradeoff: a spec (checked against the spec schema by the route, its errors under
 * /spec), one of the topologies, and 1 to 40 tail currents in amperes. A current the sizing cannot
 * use is not refused here: its point answers with the reason, so one bad value loses nothing else.
 */
export const TRADEOFF_BODY = wire<TradeoffInput>()(
  {
    spec: { type: 'object' },
    topology: { enum: [...TOPOLOGIES] },
    tailCurrentsA: { type: 'array', minItems: 1, maxItems: TRADEOFF_SWEEP_MAX_POINTS, items: { type: 'number' } },
  },
  ['spec', 'topology', 'tailCurrentsA'],
);

/** POST /api/proposals/:id/verification/monte-carlo. */
export const MONTE_CARLO_BODY = wire<MonteCarloInput>()(
  {
    topology: { enum: [...TOPOLOGIES] },
    source: { enum: ['option', 'decision'], default: 'option' },
    runs: { type: 'integer', minimum: MONTE_CARLO_RUNS.min, maximum: MONTE_CARLO_RUNS.max, default: MONTE_CARLO_RUNS.default },
  },
  [],
);

export const NETLIST_QUERY = wire<Defaulted<NetlistQuery, 'source' | 'drive'>>()(
  {
    topology: { enum: [...TOPOLOGIES] },
    source: { enum: ['option', 'decision'], default: 'option' },
    drive: { enum: ['differential', 'common-mode'], default: 'differential' },
  },
  [],
);

/** POST /api/projects/:id/specs/import: `?dryRun=true` reports each row and saves nothing. */
export const IMPORT_QUERY = wire<Partial<ImportQuery>>()({ dryRun: { enum: ['true', 'false'], default: 'false' } }, []);

/** GET /api/projects/:id/proposals.csv?ids=12,13,14: the ids' form is checked by the route (the value arrives as text). */
export const BATCH_CSV_QUERY = wire<{ ids: unknown }>()({ ids: {} }, ['ids']);

/** A comment's or reply's text: multi-line plain text, not empty, at most COMMENT_MAX_LENGTH characters (blank is refused by the service). */
const commentBody = { type: 'string', minLength: 1, maxLength: COMMENT_MAX_LENGTH, pattern: PLAIN_LINES_PATTERN } as const;

/** POST /api/proposals/:id/comments: a new thread on one anchor (the service checks the anchor's fields belong to its kind and to the proposal). */
export const COMMENT_BODY = wire<CommentInput>()(
  {
    anchorKind: { enum: [...COMMENT_ANCHOR_KINDS] },
    topology: { enum: [...TOPOLOGIES] },
    checkId: { type: 'string', minLength: 1, maxLength: 80, pattern: '^[a-z0-9][a-z0-9-]*$' },
    figureKey: { enum: [...COMMENT_FIGURE_KEYS] },
    jobId: { type: 'integer', minimum: 1 },
    body: commentBody,
  },
  ['anchorKind', 'topology', 'body'],
);

/** POST /api/proposals/:id/comments/:commentId/replies. */
export const REPLY_BODY = wire<ReplyInput>()({ body: commentBody }, ['body']);

/** PATCH /api/proposals/:id/comments/:commentId: resolve or reopen the thread. */
export const THREAD_STATE_BODY = wire<ThreadStateInput>()({ resolved: { type: 'boolean' } }, ['resolved']);
