/**
 * The search's words: how indexed text and a query are cut into words (the one rule for both, so
 * SQLite's FTS5 and PostgreSQL's text search see the same words), how a query becomes a match
 * expression for each, and which words of a text a query matched. Pure.
 *
 * A word is a run of letters and digits, or a decimal number ("4.7", kept whole so "4.7 kΩ" is
 * not any 4 and any 7); everything else (punctuation, quotes, operators, symbols) only separates
 * words. Words are compared in lower case with accents dropped and compatibility forms folded
 * (NFKD: "µ" is "μ", "Ω" the ohm sign is "Ω", "²" is "2"). So no character a person types ever
 * reaches a match expression except letters, digits and the point inside a number: user text is
 * data, and the expressions are passed as parameters.
 */
import type { MarkedText } from '#shared/api/search';

/** A word as the index and the query keep it: a decimal number, or letters and digits. */
const WORD = /\p{N}+(?:\.\p{N}+)+|[\p{L}\p{N}]+/gu;
/** What the expressions below may contain of a word (a check on WORD's output, never relied on alone). */
const SAFE_WORD = /^[\p{L}\p{N}.]+$/u;
/** A number, possibly decimal: with the word after it ("80 dB"), a phrase. */
const NUMBER = /^\p{N}+(?:\.\p{N}+)*$/u;
/** A run of text the marking reads as one piece (a word with its accents as typed). */
const PIECE = /\p{N}+(?:\.\p{N}+)+|[\p{L}\p{N}\p{M}]+/gu;

/** Longer runs are not words anyone types (checksums, pasted data): left out of the index and the query. */
export const MAX_WORD_LENGTH = 48;
/** Words of a query past this many are ignored (each costs a look-up). */
export const MAX_QUERY_WORDS = 12;

/** Lower case, accents dropped, compatibility forms folded. */
function folded(text: string): string {
  return text.normalize('NFKD').toLowerCase().replace(/\p{M}+/gu, '').normalize('NFC');
}

/** The words of a text, in order, as the index stores them. */
export function searchWords(text: string): string[] {
  return [...folded(text).matchAll(WORD)].map((m) => m[0]).filter((word) => word.length <= MAX_WORD_LENGTH);
}

/** The words of a text joined by single spaces: what the index's word columns hold. */
export function indexedWords(text: string): string {
  return searchWords(text).join(' ');
}

/**
 * One part of a query: a word, or a number and the word after it as a phrase ("80 dB": 80
 * followed by dB, not any 80 and any dB); `prefix` when its last word may be the start of a
 * longer one (the query's last part while it is being typed).
 */
export interface QueryPart {
  words: string[];
  prefix: boolean;
}

/** The parts of a query; none when it holds no word. Every part must match (AND). */
export function queryParts(query: string): QueryPart[] {
  const words = searchWords(query).slice(0, MAX_QUERY_WORDS);
  const parts: QueryPart[] = [];
  for (let i = 0; i < words.length; i += 1) {
    const unit = NUMBER.test(words[i]) && i + 1 < words.length && !NUMBER.test(words[i + 1]) ? words[i + 1] : null;
    parts.push({ words: unit ? [words[i], unit] : [words[i]], prefix: false });
    if (unit) i += 1;
  }
  // A query that ends in a blank or a punctuation mark has its last word typed out.
  const last = parts.at(-1);
  if (last && /[\p{L}\p{N}]$/u.test(query)) last.prefix = true;
  return parts;
}

function checkedWord(word: string): string {
  if (!SAFE_WORD.test(word)) throw new Error(`Not a search word: ${JSON.stringify(word)}`);
  return word;
}

/** The FTS5 MATCH expression: each part a quoted string (a phrase when it holds two words), `*` after a prefix; parts side by side (AND). */
export function fts5Expression(parts: readonly QueryPart[]): string {
  return parts.map((part) => `"${part.words.map(checkedWord).join(' ')}"${part.prefix ? '*' : ''}`).join(' ');
}

/** The PostgreSQL tsquery text: each word a quoted lexeme, `<->` inside a phrase, `:*` after a prefix, parts joined by `&`. */
export function tsqueryText(parts: readonly QueryPart[]): string {
  return parts
    .map((part) => part.words.map((word, i) => `'${checkedWord(word)}'${part.prefix && i === part.words.length - 1 ? ':*' : ''}`).join(' <-> '))
    .join(' & ');
}

/** Whether a word of a text answers a word asked for (the whole word, or its start for a prefix). */
function answers(word: string, asked: string, prefix: boolean): boolean {
  return word === asked || (prefix && word.startsWith(asked));
}

/**
 * Where the query's parts match a text's words: each part's words in a row (a phrase's number and
 * unit side by side), its last one as a prefix while being typed. Which words matched, and which
 * parts (by index) did.
 */
function matchesIn(words: readonly string[], parts: readonly QueryPart[]): { matched: boolean[]; parts: Set<number> } {
  const matched = words.map(() => false);
  const found = new Set<number>();
  parts.forEach((part, p) => {
    const last = part.words.length - 1;
    for (let at = 0; at + last < words.length; at += 1) {
      if (!part.words.every((asked, k) => answers(words[at + k], asked, part.prefix && k === last))) continue;
      found.add(p);
      for (let k = 0; k <= last; k += 1) matched[at + k] = true;
    }
  });
  return { matched, parts: found };
}

/** The text cut into plain and marked pieces: each run of letters and digits holding a word the query matched is marked. */
export function markWords(text: string, parts: readonly QueryPart[]): MarkedText {
  const runs = [...text.matchAll(PIECE)].map((match) => ({ at: match.index, text: match[0], words: searchWords(match[0]) }));
  const { matched } = matchesIn(
    runs.flatMap((run) => run.words),
    parts,
  );
  const pieces: MarkedText = [];
  const push = (piece: string, marked: boolean) => {
    if (piece === '') return;
    const last = pieces.at(-1);
    if (last && last.marked === marked) last.text += piece;
    else pieces.push({ text: piece, marked });
  };
  let at = 0;
  let word = 0;
  for (const run of runs) {
    const hit = run.words.some((_w, k) => matched[word + k]);
    word += run.words.length;
    if (!hit) continue;
    push(text.slice(at, run.at), false);
    push(run.text, true);
    at = run.at + run.text.length;
  }
  push(text.slice(at), false);
  // Marked words with only blanks between them read as one mark ("80 dB").
  for (let i = pieces.length - 2; i > 0; i -= 1) {
    if (!pieces[i].marked && /^\s+$/u.test(pieces[i].text) && pieces[i - 1].marked && pieces[i + 1].marked) {
      pieces.splice(i - 1, 3, { text: pieces[i - 1].text + pieces[i].text + pieces[i + 1].text, marked: true });
      i -= 1;
    }
  }
  return pieces;
}

/** The parts of the query (by index) that the text's words match. */
export function partsMatched(text: string, parts: readonly QueryPart[]): Set<number> {
  return matchesIn(searchWords(text), parts).parts;
}
