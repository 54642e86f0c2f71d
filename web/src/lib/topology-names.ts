/** Readable topology names: one list for the server and the app (shared/engine/topology-names.ts). */
export { TOPOLOGY_NAMES, topologyName } from '../../../shared/engine/topology-names';
