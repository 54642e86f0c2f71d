// @vitest-environment jsdom
import { cleanup, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, test, vi } from 'vitest';
import { AuditTimeline } from '../../../../web/src/features/proposals/components/audit-timeline';
import { mockFetch } from './fixtures/fetch-mock';
import { auditEvent, DESIGNER, proposalFixture, rankedOptionOf, REVIEWER } from './fixtures/proposal-fixture';
import { renderWithClient } from '../../helpers/render';

let fetchMock: ReturnType<typeof mockFetch>;

afterEach(() => {
  cleanup();
  expect(fetchMock.unmocked).toEqual([]);
  vi.unstubAllGlobals();
});

const event = (id: number, action: string, actorId: number, entityId: number, details: Record<string, unknown>) => auditEvent(id, `2026-03-02T0${id}:00:00.000Z`, action, actorId, entityId, details);

describe('AuditTimeline', () => {
  test('when the trail loads, then each event reads in plain words with names, times and state changes', async () => {
    const design = { ...rankedOptionOf('degenerated-mirror').design!, tail: { topology: 'degenerated-mirror' as const, referenceResistanceOhm: 13700, emitterResistanceOhm: 2100 } };
    const proposal = proposalFixture({
      status: 'returned',
      decisions: [{ id: 11, proposalId: 2, kind: 'override', topology: 'degenerated-mirror', design, evaluation: null, reason: 'Parts on hand.', decidedById: DESIGNER.id, createdAt: '2026-03-02T02:00:00.000Z' }],
      reviews: [{ id: 21, proposalId: 2, decisionId: 11, verdict: 'return', comment: 'Check the low end.', reviewerId: REVIEWER.id, createdAt: '2026-03-02T03:00:00.000Z' }],
    });
    fetchMock = mockFetch({
      'GET /api/proposals/2': () => ({ body: proposal }),
      'GET /api/projects/1/members': () => ({ body: { items: [DESIGNER, REVIEWER] } }),
      'GET /api/proposals/2/audit': () => ({
        body: {
          items: [
            event(1, 'proposal.ranked', DESIGNER.id, 2, { specVersion: 1, recommended: 'degenerated-mirror', status: 'ranked' }),
            event(2, 'proposal.decided', DESIGNER.id, 11, { kind: 'override', topology: 'degenerated-mirror', from: 'ranked', to: 'decided', passes: true }),
            event(3, 'proposal.returned', REVIEWER.id, 21, { verdict: 'return', from: 'decided', to: 'returned' }),
            event(4, 'proposal.decided', 99, 12, { kind: 'accept', topology: 'degenerated-mirror', from: 'returned', to: 'decided' }),
          ],
        },
      }),
    });
    renderWithClient(<AuditTimeline proposalId={2} />);

    expect(screen.getByRole('status').textContent).toMatch(/Loading the record/);
    const list = await screen.findByRole('list', { name: /Events, oldest first/ });
    const items = within(list).getAllByRole('listitem');
    expect(items).toHaveLength(4);
    expect(items[0].textContent).toMatch(/ranked by the engine; recommended: Degenerated mirror/);
    await within(items[1]).findByText('Priya Valcourt');
    expect(items[1].textContent).toMatch(/decided: own values \(Degenerated mirror\)/);
    expect(items[1].textContent).toMatch(/Reason: .*Parts on hand\./);
    expect(items[1].textContent).toMatch(/Awaiting decision.*to.*Awaiting review/);
    expect(items[2].textContent).toMatch(/Samir Edelstein sent the decided design back for rework/);
    expect(items[2].textContent).toMatch(/Check the low end\./);
    expect(items[3].textContent).toMatch(/user #99 decided: accepted the recommendation/);
    const time = items[0].querySelector('time')!;
    expect(time.getAttribute('dateTime')).toBe('2026-03-02T01:00:00.000Z');
    expect(time.getAttribute('title')).toBe('2026-03-02T01:00:00.000Z');
  });

  test('when the trail cannot be read, then the error shows in place', async () => {
    fetchMock = mockFetch({
      'GET /api/proposals/2': () => ({ body: proposalFixture() }),
      'GET /api/projects/1/members': () => ({ body: { items: [] } }),
      'GET /api/proposals/2/audit': () => ({ status: 500, body: { error: 'The server failed.', code: 'internal' } }),
    });
    renderWithClient(<AuditTimeline proposalId={2} />);
    expect((await screen.findByRole('alert')).textContent).toContain('The server failed.');
  });
});
