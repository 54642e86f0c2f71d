/**
 * The comparison's state in the address, so a link reproduces the view:
 * `/compare?a=12&b=15&tailA=wilson&tailB=cascode` (a tail left out: that proposal's current
 * design, else its recommendation).
 */
export interface CompareState {
  a: number;
  b: number;
  tailA: string | null;
  tailB: string | null;
}

const TAIL = /^[a-z][a-z0-9-]{0,40}$/;

function id(text: string | null): number | null {
  if (text === null || !/^[1-9]\d{0,14}$/.test(text)) return null;
  return Number(text);
}

function tail(text: string | null): string | null {
  return text !== null && TAIL.test(text) ? text : null;
}

/** The comparison the address names, or null when it does not name two proposals. */
export function readCompareState(params: URLSearchParams): CompareState | null {
  const a = id(params.get('a'));
  const b = id(params.get('b'));
  if (a === null || b === null) return null;
  return { a, b, tailA: tail(params.get('tailA')), tailB: tail(params.get('tailB')) };
}

/** The query string of a comparison ("?a=12&b=15&tailA=wilson"). */
export function compareQuery(state: CompareState): string {
  const params = new URLSearchParams({ a: String(state.a), b: String(state.b) });
  if (state.tailA) params.set('tailA', state.tailA);
  if (state.tailB) params.set('tailB', state.tailB);
  return `?${params}`;
}
