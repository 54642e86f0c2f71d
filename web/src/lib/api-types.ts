/** Shapes the API answers with (see api/services). Engine shapes come from shared/engine. */
import type { CurrentDesign, CurrentDesignSummary } from '../../../shared/workflow/current-design';
import type { DesignBinding } from '../../../shared/verification/binding';
import type { Design, RecommendResult } from '../../../shared/engine/index';
import type { Spec as SpecDocument } from '../../../shared/engine/types';
import type { JsonChange } from '../../../shared/json-diff';
import type { ProposalEvent, ProposalState } from '../../../shared/workflow/proposal-states';
import type { AccountRole, ProjectRole, ProjectRoleOf } from '../../../shared/workflow/roles';

export interface User {
  id: number;
  email: string;
  displayName: string;
  /** The account's own role: administrator or member (what a member may do is per project). */
  role: AccountRole;
  /** The role held in each project (the signed-in person, from /api/auth/me and sign-in). */
  projectRoles?: ProjectRoleOf[];
  /** E-mail notifications on (the server always answers it; absent counts as on). */
  notify?: boolean;
  createdAt: string;
  /** When an administrator disabled the account (it cannot sign in), or null. */
  disabledAt?: string | null;
}

/** A project's member (GET /api/projects/:id/members): the account and the role held in that project. */
export type ProjectMember = User & { projectRole: ProjectRole | null };

/** The admin mailbox (GET /api/admin/mail). */
export type { Mailbox, ReceivedMail } from '../../../shared/mail/types';

export interface Project {
  id: number;
  name: string;
  description: string;
  createdById: number;
  createdAt: string;
}

export interface SpecVersion {
  id: number;
  specId: number;
  version: number;
  title: string;
  payload: SpecDocument;
  /** What changed and why, in the author's words (null when none was written). */
  note: string | null;
  createdById: number;
  createdAt: string;
}

export interface Spec {
  id: number;
  projectId: number;
  title: string;
  latestVersion: number;
  createdById: number;
  createdAt: string;
  updatedAt: string;
}

export interface SpecWithLatest extends Spec {
  latest: SpecVersion;
  /** PUT answers: true when the document was the latest version's, so no version was written. */
  unchanged?: boolean;
}

export interface SpecDiff {
  from: number;
  to: number;
  changes: JsonChange[];
}

export interface ProposalSummary {
  id: number;
  /** In list answers: the spec version's number and title (absent on a single proposal). */
  specVersionNumber?: number | null;
  specTitle?: string | null;
  projectId: number;
  specId: number;
  specVersionId: number;
  engineVersion: string;
  rulesetVersion: string;
  recommendedTopology: string | null;
  status: ProposalState;
  /** Superseded: the newer proposal that closed this one. */
  supersededById: number | null;
  /** Withdrawn: the reason given. */
  closedReason: string | null;
  /** Who withdrew it (null when the server closed it as superseded). */
  closedById: number | null;
  closedAt: string | null;
  createdById: number;
  createdAt: string;
  updatedAt: string;
  /** In list answers: which design is current (shared/workflow/current-design.ts); null when none. */
  currentDesign?: CurrentDesignSummary | null;
}

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

export type OptionEvaluation = RecommendResult['options'][number];

export interface Decision {
  id: number;
  proposalId: number;
  kind: 'accept' | 'choose' | 'override';
  topology: string;
  design: Design;
  evaluation: OptionEvaluation | null;
  reason: string | null;
  decidedById: number;
  createdAt: string;
}

export interface Review {
  id: number;
  proposalId: number;
  decisionId: number;
  verdict: 'approve' | 'return';
  comment: string | null;
  reviewerId: number;
  createdAt: string;
  /** A sign-off: the finished SPICE job it relied on (null: none about the design; absent on older reviews). */
  verificationJobId?: number | null;
  /** The reviewer signed off although that job simulated another design. */
  staleVerificationAccepted?: boolean;
}

export interface Proposal extends ProposalSummary {
  result: RecommendResult;
  specVersion: { id: number; version: number; title: string; note: string | null; payload: SpecDocument };
  /** Set when the spec has newer versions than the one ranked: the latest and the differences to it. */
  specMovedOn: { latestVersion: number; latestTitle: string; latestNote: string | null; latestPayload: SpecDocument; changes: JsonChange[] } | null;
  decisions: Decision[];
  reviews: Review[];
  allowedEvents: ProposalEvent[];
  /** The current design with its binding (what a verification of exactly it would record); null when none. */
  currentDesign?: (CurrentDesign & { binding: DesignBinding | null }) | null;
}

export interface AuditEvent {
  id: number;
  at: string;
  actorId: number | null;
  action: string;
  entityType: string;
  entityId: number;
  projectId: number | null;
  proposalId: number | null;
  beforeId: number | null;
  afterId: number | null;
  details: Record<string, unknown>;
}

export interface Items<T> {
  items: T[];
}

/** POST /api/analyze: the engine's figures for one design at its own conditions, with the estimates notice. */
export type AnalyzeResponse = import('../../../shared/engine/types').AnalyzeResult & { notice: string };

/** POST /api/proposals/:id/decision body. */
export interface DecisionInput {
  kind: Decision['kind'];
  topology?: import('../../../shared/engine/types').TopologyId;
  design?: Design;
  reason?: string;
}

/** POST /api/proposals/:id/review body. */
export interface ReviewInput {
  verdict: Review['verdict'];
  comment?: string;
  /** Sign off although the only verification of the design simulated another one (needs a comment). */
  acceptStaleVerification?: boolean;
}
