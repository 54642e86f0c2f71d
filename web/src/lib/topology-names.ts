/** Readable topology names: the catalogue's, one list for the server and the app (shared/engine/topologies.ts). */
export { topologyName } from '#shared/engine/topologies';
