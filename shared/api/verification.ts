/** SPICE verification on the wire: /api/proposals/:id/verification (the job and result shapes live in shared/verification/types.ts). */
import type { TopologyId } from '../engine/types';

export type { VerificationJobView, VerificationStatus } from '../verification/types';

/** POST /api/proposals/:id/verification/monte-carlo: a ranked option by its topology, or the decided design (`source: 'decision'`, own values included). */
export interface MonteCarloInput {
  topology?: TopologyId;
  source?: 'option' | 'decision';
  /** Random circuits to simulate (MONTE_CARLO_RUNS: default, least, most). */
  runs?: number;
}
