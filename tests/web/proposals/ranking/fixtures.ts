/**
 * Rankings made by the real engine from invented specs (tests/web/fixtures/specs/), written by
 * `npm run generate:web-fixtures` and checked for drift by tests/web/fixtures/web-fixtures.test.ts.
 * Tests read the figures they expect from these objects; they never copy one into an assertion.
 * Strain bridge: differential output, Monte Carlo, simplest-sufficient; studio line: single-ended,
 * pair degeneration, highest-rejection.
 */
import { readFileSync } from 'node:fs';
import type { RecommendResult } from '#shared/engine/recommend';
import type { Spec } from '#shared/engine/types';
import type { Proposal } from '#shared/api/proposals';

function json<T>(relative: string): T {
  return JSON.parse(readFileSync(new URL(relative, import.meta.url), 'utf8')) as T;
}

export const strainBridge = (): RecommendResult => json('../../fixtures/bridge-receiver.generated.json');
export const studioLine = (): RecommendResult => json('../../fixtures/line-receiver.generated.json');
/** Differential output with noise, bias-current, slew-rate and offset targets; noise and offset fall short on every option. */
export const hydrophonePreamp = (): RecommendResult => json('../../fixtures/hydrophone-preamp.generated.json');
/** Gain ±2 % from −40 to 85 °C, with the PTAT tail and its PNP among the options. */
export const geophoneNode = (): RecommendResult => json('../../fixtures/geophone-node.generated.json');
/** A PNP pair on a single 5 V supply (rails 5 V and 0 V), its input range reaching 0 V. */
export const pressureProbe = (): RecommendResult => json('../../fixtures/pressure-probe.generated.json');

const SPEC_FILES = {
  strain: '../../fixtures/specs/bridge-receiver.json',
  studio: '../../fixtures/specs/line-receiver.json',
  hydrophone: '../../fixtures/specs/hydrophone-preamp.json',
  geophone: '../../fixtures/specs/geophone-node.json',
  pressure: '../../fixtures/specs/pressure-probe.json',
} as const;

/** The spec a fixture was ranked from. */
export const specOf = (spec: keyof typeof SPEC_FILES = 'strain'): Spec => json<Spec>(SPEC_FILES[spec]);

/** A stored proposal around a recommend result, as GET /api/proposals/:id answers. */
export function proposalOf(result: RecommendResult, spec: keyof typeof SPEC_FILES = 'strain'): Proposal {
  const payload = specOf(spec);
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
