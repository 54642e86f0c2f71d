import type { TopologyId } from './types';

/** Readable names of the tail topologies, as the app writes them. */
export const TOPOLOGY_NAMES: Readonly<Record<TopologyId, string>> = {
  resistor: 'Resistor',
  'simple-mirror': 'Simple mirror',
  'degenerated-mirror': 'Degenerated mirror',
  widlar: 'Widlar source',
  wilson: 'Wilson mirror',
  cascode: 'Cascode mirror',
};

/** The readable name of a topology id; an unknown id is shown as itself, de-hyphenated, rather than hidden. */
export function topologyName(id: string): string {
  return (TOPOLOGY_NAMES as Record<string, string>)[id] ?? id.replaceAll('-', ' ');
}
