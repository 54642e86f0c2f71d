/**
 * Why a hit matched (api/search/search-excerpt.ts): the line of its text that answers what the
 * title does not, a number and its unit taken together, long lines clipped around the match with
 * their label kept, at most two lines.
 */
import { describe, expect, test } from 'vitest';
import { excerptOf } from '../../../api/search/search-excerpt';
import { queryParts } from '../../../api/search/search-words';

const plain = (pieces: { text: string }[] | null) => (pieces ?? []).map((p) => p.text).join('');
const marked = (pieces: { text: string; marked: boolean }[] | null) => (pieces ?? []).filter((p) => p.marked).map((p) => p.text);

const SPEC_LINES = [
  'Version 2',
  'Note: Rejection margin raised from 3 dB to 6 dB after the rev A board',
  'Minimum CMRR: 78 dB',
  'Tail options: Resistor, Simple mirror, Degenerated mirror, Widlar source, Wilson mirror, Cascode mirror, PTAT source',
  'Positive rail: 7.5 V',
];

describe('excerptOf', () => {
  test('when a value and its unit are asked for, then the line holding them side by side is quoted, not a line holding the unit elsewhere', () => {
    const excerpt = excerptOf('Kestrel rev B', SPEC_LINES, queryParts('78 dB'));
    expect(plain(excerpt)).toBe('Minimum CMRR: 78 dB');
    expect(marked(excerpt)).toEqual(['78 dB']);
  });

  test('when the title holds every word asked for, then there is no excerpt', () => {
    expect(excerptOf('Kestrel rev B', SPEC_LINES, queryParts('kestrel rev'))).toBeNull();
  });

  test('when a long line matches, then it is clipped around the match with its label kept', () => {
    const excerpt = excerptOf('Kestrel rev B', SPEC_LINES, queryParts('ptat'));
    expect(plain(excerpt).startsWith('Tail options: …')).toBe(true);
    expect(plain(excerpt).length).toBeLessThanOrEqual(95);
    expect(marked(excerpt)).toEqual(['PTAT']);
  });

  test('when the words are on two lines, then both are quoted; never more than two', () => {
    expect(plain(excerptOf('Kestrel rev B', SPEC_LINES, queryParts('7.5 V 78 dB')))).toBe('Minimum CMRR: 78 dB · Positive rail: 7.5 V');
    // Three lines would be needed: the first two in the text's order are quoted.
    expect(plain(excerptOf('Kestrel rev B', SPEC_LINES, queryParts('version margin 7.5 V')))).toBe('Version 2 · Note: Rejection margin raised from 3 dB to 6 dB after the rev A board');
  });
});
