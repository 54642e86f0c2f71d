/** Requirement specs on the wire: /api/projects/:id/specs and /api/specs/:id (versions, differences). */
import type { Spec as SpecDocument } from '../engine/types';
import type { JsonChange } from '../json-diff';

/** A spec record: its versions hold the content; `latestVersion` is the newest number. */
export interface Spec {
  id: number;
  projectId: number;
  title: string;
  latestVersion: number;
  createdById: number;
  createdAt: string;
  updatedAt: string;
}

/** One version of a spec: the document as validated (defaults applied). */
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

/** GET /api/specs/:id, and the answer of a create or a save. */
export interface SpecWithLatest extends Spec {
  latest: SpecVersion;
  /** PUT answers: true when the document was the latest version's, so no version was written. */
  unchanged?: boolean;
}

/**
 * POST /api/projects/:id/specs and PUT /api/specs/:id: the title and the spec document. The route
 * takes any JSON object as the document; the service puts the title in and checks it against the
 * spec schema (a 400 naming each field under /payload), filling in the defaults.
 */
export interface SpecInput {
  title: string;
  payload: Record<string, unknown>;
  /** What changed and why (optional; stored with the version; never blank). */
  note?: string;
}

/** GET /api/specs/:id/diff?from=&to=. */
export interface DiffQuery {
  from: number;
  to: number;
}

/** The diff answer: field-by-field changes from one version to another. */
export interface SpecDiff {
  from: number;
  to: number;
  changes: JsonChange[];
}
