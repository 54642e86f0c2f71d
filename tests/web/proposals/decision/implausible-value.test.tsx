// @vitest-environment jsdom
/**
 * The override editor's resistor fields note a value far outside the usual range of its field
 * (the design schema's `x-typical`): a 1 GΩ collector resistor is allowed by the schema but
 * almost surely a slip, so the value understood is shown with the note; a usual value has none.
 */
import { cleanup, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import { DecisionPanel } from '../../../../web/src/features/proposals/components/decision-panel';
import { mockFetch, type Call } from './fixtures/fetch-mock';
import { DESIGNER, proposalFixture, RANKING, rankedOptionOf, REVIEWER } from './fixtures/proposal-fixture';
import { renderWithClient } from '../../helpers/render';

let fetchMock: ReturnType<typeof mockFetch>;

afterEach(() => {
  cleanup();
  expect(fetchMock.unmocked).toEqual([]);
  vi.unstubAllGlobals();
});

function analyzeAnswer(call: Call) {
  const design = call.body as { tail: { topology: string } };
  return { body: { ...rankedOptionOf(design.tail.topology).predicted!, notice: RANKING.notice } };
}

describe('the override editor with an implausible value', () => {
  test('when a 1 GΩ collector resistor is typed, then the value understood carries a note; 4k7 carries none', async () => {
    fetchMock = mockFetch({ 'GET /api/projects/1/members': () => ({ body: { items: [DESIGNER, REVIEWER] } }), 'POST /api/analyze': analyzeAnswer });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);
    await user.click(screen.getByRole('radio', { name: 'Use my own values' }));
    const collector = screen.getByRole('textbox', { name: 'Collector resistor' });
    const reading = () => document.getElementById(collector.getAttribute('aria-describedby') ?? '')?.textContent ?? '';

    await user.clear(collector);
    await user.type(collector, '1G');
    expect(reading()).toMatch(/= 1 GΩ/);
    expect(reading()).toMatch(/1 GΩ is far above the usual for this field \(up to 1 MΩ\)/);

    await user.clear(collector);
    await user.type(collector, '4k7');
    expect(reading()).toMatch(/= 4\.7 kΩ/);
    expect(reading()).not.toMatch(/far above|far below/);
  });
});
