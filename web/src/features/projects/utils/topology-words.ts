/** Tail topologies in words for tables (the engine's ids are for machines). */
const TOPOLOGY_WORDS: Record<string, string> = {
  resistor: 'Resistor',
  'simple-mirror': 'Simple mirror',
  'degenerated-mirror': 'Degenerated mirror',
  widlar: 'Widlar source',
  wilson: 'Wilson mirror',
  cascode: 'Cascode mirror',
};

/** The topology in words; an unknown id is shown as itself, de-hyphenated, rather than hidden. */
export function topologyWords(id: string): string {
  return TOPOLOGY_WORDS[id] ?? id.replaceAll('-', ' ');
}
