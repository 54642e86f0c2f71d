import { describe, expect, test } from 'vitest';
import { formatWhen } from '../../../web/src/lib/format-when';
import { readProposalView, writeProposalView } from '../../../web/src/features/projects/utils/proposal-filter';
import { topologyName as topologyWords } from '../../../web/src/lib/topology-names';

describe('the proposals view in the URL', () => {
  test.each([
    ['', { status: 'all', page: 1 }],
    ['?status=decided&page=3', { status: 'decided', page: 3 }],
    ['?status=bogus&page=0', { status: 'all', page: 1 }],
    ['?page=2.5', { status: 'all', page: 1 }],
  ])('when the search is "%s", then the view is %o', (search, view) => {
    expect(readProposalView(new URLSearchParams(search))).toEqual(view);
  });

  test('when written, then defaults are left out and other params are kept', () => {
    expect(writeProposalView(new URLSearchParams('tab=x&page=4'), { status: 'all', page: 1 }).toString()).toBe('tab=x');
    expect(writeProposalView(new URLSearchParams(), { status: 'returned', page: 2 }).toString()).toBe('status=returned&page=2');
  });
});

describe('words for tables', () => {
  test.each([
    ['degenerated-mirror', 'Degenerated mirror'],
    ['widlar', 'Widlar source'],
    ['some-new-one', 'some new one'],
  ])('topology %s reads "%s"', (id, words) => {
    expect(topologyWords(id)).toBe(words);
  });

  const now = Date.parse('2026-12-10T12:00:00Z');
  test.each([
    ['2026-12-10T11:59:40Z', 'just now'],
    ['2026-12-10T11:55:00Z', '5 minutes ago'],
    ['2026-12-10T09:00:00Z', '3 hours ago'],
    ['2026-12-09T10:00:00Z', 'yesterday'],
  ])('%s, seen at noon on 10 Dec, is "%s"', (iso, words) => {
    expect(formatWhen(iso, now)).toBe(words);
  });

  test('when more than a week old, then the date is given, not the age', () => {
    expect(formatWhen('2026-11-01T10:00:00Z', now)).toMatch(/2026/);
  });
});
