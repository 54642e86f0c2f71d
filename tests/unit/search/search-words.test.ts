/**
 * The search's words (api/search/search-words.ts): text cut into the words both back ends index,
 * a query into parts, the match expressions built from them, and the marking of matched words.
 * The expressions are held to their grammar for any text at all (fast-check), and every FTS5
 * expression is run against a real FTS5 table (better-sqlite3's SQLite), which must never refuse
 * one: whatever a person types, it reaches the index as words, never as operators.
 */
import Database from 'better-sqlite3';
import fc from 'fast-check';
import { afterAll, describe, expect, test } from 'vitest';
import { fts5Expression, markWords, MAX_QUERY_WORDS, queryParts, searchWords, tsqueryText } from '../../../api/search/search-words';

describe('searchWords', () => {
  test.each([
    ['Minimum CMRR: 80 dB', ['minimum', 'cmrr', '80', 'db']],
    ['Source resistance 4.7 kΩ', ['source', 'resistance', '4.7', 'kω']],
    // The ohm sign (U+2126) and the micro sign (U+00B5) fold to the Greek letters, as NFKD has them.
    ['4.7 k\u2126, 20 \u00b5A', ['4.7', 'kω', '20', 'μa']],
    ['Hélène Brück', ['helene', 'bruck']],
    ['−7.5 V … 1.5.3', ['7.5', 'v', '1.5.3']],
    ['4k7 x86', ['4k7', 'x86']],
    ['"; DROP TABLE spec; --', ['drop', 'table', 'spec']],
    [`${'f'.repeat(64)} kept`, ['kept']],
  ])('when the text is %j, then the words are %j', (text, words) => {
    expect(searchWords(text)).toEqual(words);
  });
});

describe('queryParts and the expressions', () => {
  test('when a number is followed by a word, then the two are one phrase; the last part is a prefix while being typed', () => {
    expect(queryParts('cmrr 80 dB')).toEqual([
      { words: ['cmrr'], prefix: false },
      { words: ['80', 'db'], prefix: true },
    ]);
    expect(fts5Expression(queryParts('cmrr 80 dB'))).toBe('"cmrr" "80 db"*');
    expect(tsqueryText(queryParts('cmrr 80 dB'))).toBe("'cmrr' & '80' <-> 'db':*");
    expect(queryParts('cmrr 80 dB ')).toEqual([
      { words: ['cmrr'], prefix: false },
      { words: ['80', 'db'], prefix: false },
    ]);
    expect(queryParts('80 90')).toEqual([
      { words: ['80'], prefix: false },
      { words: ['90'], prefix: true },
    ]);
  });

  test(`when a query holds more than ${MAX_QUERY_WORDS} words, then only the first ${MAX_QUERY_WORDS} count`, () => {
    expect(queryParts('w '.repeat(40)).flatMap((part) => part.words)).toHaveLength(MAX_QUERY_WORDS);
  });

  const db = new Database(':memory:');
  db.exec(`CREATE VIRTUAL TABLE f USING fts5(title_words, body_words, tokenize="unicode61 remove_diacritics 0 tokenchars '.'")`);
  db.prepare('INSERT INTO f (title_words, body_words) VALUES (?, ?)').run('kestrel rev b', 'minimum cmrr 80 db source resistance 4.7 kω');
  const run = db.prepare('SELECT rowid FROM f WHERE f MATCH ?');
  afterAll(() => db.close());

  /** What an FTS5 expression and a tsquery may hold: quoted words and the few operators the builder writes. */
  const FTS5_GRAMMAR = /^(?:"[\p{L}\p{N}.]+(?: [\p{L}\p{N}.]+)?"\*?)(?: "[\p{L}\p{N}.]+(?: [\p{L}\p{N}.]+)?"\*?)*$/u;
  const TSQUERY_GRAMMAR = /^'[\p{L}\p{N}.]+'(?::\*)?(?: (?:<->|&) '[\p{L}\p{N}.]+'(?::\*)?)*$/u;

  test('for any text, then the expressions hold only quoted words and their own operators, and FTS5 accepts every one', () => {
    const operators = fc.constantFrom('"', "'", '*', ':', '^', '-', '+', '(', ')', '{', '}', 'NEAR', 'OR', 'AND', 'NOT', '&', '|', '!', '<->', ';', '--', '\\', '\u0000', ' ');
    const text = fc.array(fc.oneof(fc.string({ unit: 'grapheme' }), fc.string({ unit: 'binary' }), operators), { maxLength: 30 }).map((pieces) => pieces.join(''));
    fc.assert(
      fc.property(text, (q) => {
        const parts = queryParts(q);
        if (parts.length === 0) return;
        const fts5 = fts5Expression(parts);
        expect(fts5).toMatch(FTS5_GRAMMAR);
        expect(tsqueryText(parts)).toMatch(TSQUERY_GRAMMAR);
        expect(() => run.all(fts5)).not.toThrow();
      }),
      { numRuns: 500 },
    );
  });

  test.each([
    ['80 dB', true],
    ['4.7 kΩ', true],
    ['kest', true],
    ['kest ', false],
    ['cmrr 80 db', true],
    // A number and the word after it are a phrase: 80 followed by "kestrel" is nowhere.
    ['80 kestrel', false],
    ['kestrel 80 dB volts', false],
    ['"cmrr" OR nothing', false],
    ['NEAR(kestrel cmrr)', false],
  ])('when %j is asked of the indexed text, then found is %s', (q, found) => {
    expect(run.all(fts5Expression(queryParts(q))).length > 0).toBe(found);
  });
});

describe('markWords', () => {
  test('when words of the text were asked for, then they are marked as typed, accents and case kept; a number and its unit only side by side, as one mark', () => {
    const parts = queryParts('bruck 80 dB');
    expect(markWords('Brück: 80 dB, 800 dBm, 80 dBm; 3 dB', parts)).toEqual([
      { text: 'Brück', marked: true },
      { text: ': ', marked: false },
      // Marked words with only a blank between them are one mark.
      { text: '80 dB', marked: true },
      { text: ', 800 dBm, ', marked: false },
      // The last word is a prefix while being typed: dBm starts with it.
      { text: '80 dBm', marked: true },
      { text: '; 3 dB', marked: false },
    ]);
  });

  test('when the text holds markup, then it comes back as the same characters, in pieces', () => {
    const text = '<script>alert("x")</script> & <b>';
    const pieces = markWords(text, queryParts('script'));
    expect(pieces.map((p) => p.text).join('')).toBe(text);
    expect(pieces.filter((p) => p.marked).map((p) => p.text)).toEqual(['script', 'script']);
  });
});
