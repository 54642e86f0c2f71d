/**
 * Fixtures made by the real engine; regenerate them after an engine change:
 *   npm run --silent longtail -- recommend api/demo/specs/strain-bridge-receiver.json > tests/web/proposals/ranking/fixtures/strain-bridge.json
 *   npm run --silent longtail -- recommend api/demo/specs/studio-line-receiver.json > tests/web/proposals/ranking/fixtures/studio-line.json
 * Strain bridge: differential output, Monte Carlo; studio line: single-ended, pair degeneration.
 */
import { readFileSync } from 'node:fs';
import type { RecommendResult } from '../../../../shared/engine/recommend';
import type { Spec } from '../../../../shared/engine/types';
import type { Proposal } from '../../../../shared/api/proposals';

function json<T>(relative: string): T {
  return JSON.parse(readFileSync(new URL(relative, import.meta.url), 'utf8')) as T;
}

export const strainBridge = (): RecommendResult => json('./fixtures/strain-bridge.json');
export const studioLine = (): RecommendResult => json('./fixtures/studio-line.json');

const SPEC_FILES = { strain: '../../../../api/demo/specs/strain-bridge-receiver.json', studio: '../../../../api/demo/specs/studio-line-receiver.json' } as const;

/** A stored proposal around a recommend result, as GET /api/proposals/:id answers. */
export function proposalOf(result: RecommendResult, spec: keyof typeof SPEC_FILES = 'strain'): Proposal {
  const payload = json<Spec>(SPEC_FILES[spec]);
  return {
    id: 7,
    projectId: 1,
    specId: 2,
    specVersionId: 3,
    engineVersion: result.engineVersion,
    rulesetVersion: result.rulesetVersion,
    recommendedTopology: result.recommended,
    status: 'ranked',
    supersededById: null,
    closedReason: null,
    closedById: null,
    closedAt: null,
    createdById: 1,
    createdAt: '2026-01-01T00:00:00.000Z',
    updatedAt: '2026-01-01T00:00:00.000Z',
    result,
    specVersion: { id: 3, version: 1, title: payload.title, note: null, payload },
    specMovedOn: null,
    decisions: [],
    reviews: [],
    allowedEvents: [],
  };
}
