/** The engine on the wire: /api/health, /api/analyze and the two schemas. */
import type { AnalyzeResult, TopologyId } from '../engine/types';

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
