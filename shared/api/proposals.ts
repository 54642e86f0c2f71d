/**
 * Proposals on the wire: the ranking of a spec version, its decisions and reviews, the list, the
 * override evaluation, the netlist, the withdrawal and the audit trail.
 */
import type { RecommendResult } from '../engine/recommend';
import type { Design, Spec as SpecDocument, TopologyId } from '../engine/types';
import type { JsonChange } from '../json-diff';
import type { DesignBinding } from '../verification/binding';
import type { CurrentDesign, CurrentDesignSummary, DecisionKind } from '../workflow/current-design';
import type { ProposalEvent, ProposalState } from '../workflow/proposal-states';
import type { Page, PageQuery } from './lists';

export type { DecisionKind };
export type Verdict = 'approve' | 'return';

/** A proposal without the engine output: the list's rows and the head of a whole proposal. */
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

/** One option of a ranking as the engine evaluated it (also an override's evaluation). */
export type OptionEvaluation = RecommendResult['options'][number];

export interface Decision {
  id: number;
  proposalId: number;
  kind: DecisionKind;
  topology: string;
  design: Design;
  /** For an override: its predictions, figures and checks; else null. */
  evaluation: OptionEvaluation | null;
  reason: string | null;
  decidedById: number;
  createdAt: string;
  /** The engine and rule set that checked the decided design (null on decisions recorded before they were kept). */
  engineVersion?: string | null;
  rulesetVersion?: string | null;
}

export interface Review {
  id: number;
  proposalId: number;
  decisionId: number;
  verdict: Verdict;
  comment: string | null;
  reviewerId: number;
  createdAt: string;
  /** A sign-off: the finished SPICE job it relied on (null: none about the design; absent on older reviews). */
  verificationJobId?: number | null;
  /** The reviewer signed off although that job simulated another design. */
  staleVerificationAccepted?: boolean;
}

/** The spec version a proposal ranked, as it answers with it. */
export interface RankedSpecVersion {
  id: number;
  version: number;
  title: string;
  note: string | null;
  payload: SpecDocument;
}

/** How far the spec has moved on since the proposal's version: null while it is the latest. */
export interface SpecMovedOn {
  latestVersion: number;
  latestTitle: string;
  /** The latest version's change note, when its author wrote one. */
  latestNote: string | null;
  /** The latest version's document (lists in the differences are shown whole). */
  latestPayload: SpecDocument;
  /** Differences from the proposal's version to the latest, field by field. */
  changes: JsonChange[];
}

/** The current design with its binding (what a verification of exactly it would record). */
export type BoundCurrentDesign = CurrentDesign & { binding: DesignBinding | null };

/** A whole proposal (GET /api/proposals/:id, and the answer of ranking a spec). */
export interface Proposal extends ProposalSummary {
  result: RecommendResult;
  specVersion: RankedSpecVersion;
  /** Set when the spec has newer versions than the one ranked: the latest and the differences to it. */
  specMovedOn: SpecMovedOn | null;
  decisions: Decision[];
  reviews: Review[];
  allowedEvents: ProposalEvent[];
  /** The current design with its binding; null when none. */
  currentDesign?: BoundCurrentDesign | null;
}

/** GET /api/projects/:id/proposals?status=&page=&pageSize= or ?status=&cursor=&pageSize=. */
export interface ProposalListQuery extends PageQuery {
  status?: ProposalState;
  /** `<createdAt>~<id>`: the `nextCursor` of the page before; the page number is then not used. */
  cursor?: string;
}

/** A page of the proposal list: numbered, or after a cursor (`page` null). */
export interface ProposalPage extends Omit<Page<ProposalSummary>, 'page'> {
  page: number | null;
  /** The cursor of the next page; null when this page is not full. */
  nextCursor: string | null;
}

/** POST /api/proposals/:id/decision. */
export interface DecisionInput {
  kind: DecisionKind;
  /** A "choose" decision: the ranked option chosen. */
  topology?: TopologyId;
  /** An "override": the designer's own values. */
  design?: Design;
  /** Required unless the recommendation is accepted. */
  reason?: string;
}

/** POST /api/proposals/:id/review. */
export interface ReviewInput {
  verdict: Verdict;
  comment?: string;
  /**
   * Sign off although the only SPICE verification of the decided design simulated another design
   * (or was stored before results recorded what they simulated); needs a comment saying why.
   */
  acceptStaleVerification?: boolean;
}

/** POST /api/proposals/:id/withdrawal: why the proposal is withdrawn (not blank). */
export interface WithdrawalInput {
  reason: string;
}

/** POST /api/proposals/:id/evaluation: a designer's own values, checked as an override would be. */
export interface EvaluationInput {
  design: Design;
}

/** GET /api/proposals/:id/netlist.cir: a ranked option's or the decided design's SPICE netlist. */
export interface NetlistQuery {
  topology?: TopologyId;
  source: 'option' | 'decision';
  drive: 'differential' | 'common-mode';
}
