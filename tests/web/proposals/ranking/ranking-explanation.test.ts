/**
 * The sentence under the ranking table when the first row is not the recommendation (the table
 * orders by tail impedance, the policy picks the recommendation).
 */
import { describe, expect, test } from 'vitest';
import { rankingExplanation } from '../../../../web/src/features/proposals/lib/ranking-explanation';

const options = (...topologies: string[]) => topologies.map((topology) => ({ topology })) as never;

describe('rankingExplanation', () => {
  test('when the cascode heads the table and the policy recommends the degenerated mirror third, then one sentence names both reasons', () => {
    const text = rankingExplanation({ policy: 'simplest-sufficient', recommended: 'degenerated-mirror', options: options('cascode', 'wilson', 'degenerated-mirror') });
    expect(text).toMatch(/^Ranked by tail impedance at the spec’s frequency, passing options first, so Cascode.* heads the table; recommended by the policy “simplest sufficient”/);
    expect(text).toMatch(/Degenerated mirror \(row 3\)\.$/);
  });

  test.each([
    ['the first row is the recommendation', { policy: 'highest-rejection', recommended: 'cascode', options: options('cascode', 'wilson') }],
    ['nothing is recommended', { policy: 'simplest-sufficient', recommended: null, options: options('cascode', 'wilson') }],
  ] as const)('when %s, then no sentence', (_title, result) => {
    expect(rankingExplanation(result as never)).toBeNull();
  });
});
