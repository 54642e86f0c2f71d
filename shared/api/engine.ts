/** The engine on the wire: /api/health, /api/analyze, /api/tradeoff and the two schemas. */
import type { AnalyzeResult, TopologyId } from '../engine/types';
import type { TradeoffSweepPoint } from '../engine/tradeoff-sweep';

/** POST /api/analyze: the engine's figures for one design at its own conditions, with the estimates notice. */
export type AnalyzeResponse = AnalyzeResult & { notice: string };

/** GET /api/health. */
export interface Health {
  status: 'ok';
  engineVersion: string;
  rulesetVersion: string;
}

/** GET /api/topologies: the tail topologies in order of simplicity. */
export interface TopologyItem {
  id: TopologyId;
  simplicityRank: number;
}

/** POST /api/tradeoff: one topology of a spec sized at each of these tail currents (A, at most 40). */
export interface TradeoffInput {
  /** The spec document (checked against the spec schema like a saved version). */
  spec: object;
  topology: TopologyId;
  tailCurrentsA: number[];
}

/** POST /api/tradeoff: each current's nominal figures, or why it has none, with the estimates notice. */
export interface TradeoffResponse {
  topology: TopologyId;
  points: TradeoffSweepPoint[];
  notice: string;
}
