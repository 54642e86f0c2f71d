/** Readable topology names: the catalogue's, one list for the server and the app (shared/engine/topologies.ts). */
import { topologyName } from '#shared/engine/topologies';

export { topologyName };

/**
 * A topology's name inside a sentence ("accept the cascode mirror"): the first letter lowered,
 * unless the first word is an acronym ("PTAT (constant-gm) source" stays as it is).
 */
export function topologyNameInText(id: string | null | undefined): string {
  const name = topologyName(id);
  return /^[A-Z][a-z]/.test(name) ? `${name[0].toLowerCase()}${name.slice(1)}` : name;
}
