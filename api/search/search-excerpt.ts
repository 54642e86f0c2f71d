/**
 * Why a record matched: its title with the query's words marked, and the line or two of its text
 * that hold the words the title does not (a spec's "Minimum CMRR: 80 dB"), clipped around the
 * first marked word. Plain text in pieces, never markup. Pure.
 */
import type { MarkedText } from '#shared/api/search';
import { markWords, partsMatched, type QueryPart } from './search-words';

/** Lines an excerpt quotes at most. */
const EXCERPT_LINES = 2;
/** A quoted line is clipped to about this many characters, around its first matched word. */
const LINE_CHARACTERS = 90;
/** Characters of a clipped value kept before its first matched word. */
const LEAD_CHARACTERS = 20;
/** A line's label ("Tail options: ") is kept whole when it is no longer than this. */
const LABEL_CHARACTERS = 60;
const SEPARATOR = ' · ';

/**
 * The line clipped to about LINE_CHARACTERS around its first matched word, its label kept ("Tail
 * options: …Wilson mirror, Cascode…"), with "…" where it was cut.
 */
function clipped(line: string, parts: readonly QueryPart[]): string {
  if (line.length <= LINE_CHARACTERS) return line;
  const colon = line.indexOf(': ');
  const label = colon > 0 && colon < LABEL_CHARACTERS ? line.slice(0, colon + 2) : '';
  const value = line.slice(label.length);
  const pieces = markWords(value, parts);
  const firstMarked = pieces.findIndex((piece) => piece.marked);
  const matchAt = pieces.slice(0, Math.max(0, firstMarked)).reduce((sum, piece) => sum + piece.text.length, 0);
  let start = Math.max(0, matchAt - LEAD_CHARACTERS);
  // Start at a word's beginning.
  if (start > 0) start = value.indexOf(' ', start) + 1 || start;
  if (start > matchAt) start = matchAt;
  const end = Math.min(value.length, start + Math.max(LINE_CHARACTERS - label.length, LEAD_CHARACTERS * 2));
  return `${label}${start > 0 ? '…' : ''}${value.slice(start, end)}${end < value.length ? '…' : ''}`;
}

/** The title with the query's words marked. */
export function markedTitle(title: string, parts: readonly QueryPart[]): MarkedText {
  return markWords(title, parts);
}

/**
 * The lines that say why the record matched beyond its title: greedily the line answering most
 * of the query's parts the title does not, then the next, at most EXCERPT_LINES; null when the
 * title answers every part (or no line answers any).
 */
export function excerptOf(title: string, lines: readonly string[], parts: readonly QueryPart[]): MarkedText | null {
  const covered = partsMatched(title, parts);
  const candidates = lines.map((line) => ({ line, matched: partsMatched(line, parts) })).filter((c) => c.matched.size > 0);
  const chosen: string[] = [];
  while (covered.size < parts.length && chosen.length < EXCERPT_LINES) {
    const best = candidates
      .map((c) => ({ ...c, gain: [...c.matched].filter((part) => !covered.has(part)).length }))
      .filter((c) => c.gain > 0)
      .sort((a, b) => b.gain - a.gain)[0];
    if (!best) break;
    chosen.push(best.line);
    for (const part of best.matched) covered.add(part);
  }
  if (chosen.length === 0) return null;
  const pieces: MarkedText = [];
  chosen.forEach((line, i) => {
    if (i > 0) pieces.push({ text: SEPARATOR, marked: false });
    pieces.push(...markWords(clipped(line, parts), parts));
  });
  return pieces;
}
