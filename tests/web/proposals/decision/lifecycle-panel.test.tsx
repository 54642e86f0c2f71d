// @vitest-environment jsdom
/**
 * How a proposal's record ends besides approval, on its page: closed because the spec moved on,
 * withdrawn with a reason, and the withdrawal form (a reason first; offered to designers and to
 * whoever asked for the proposal).
 */
import { cleanup, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, describe, expect, test, vi } from 'vitest';
import type { SessionUser } from '#shared/api/users';
import { LifecyclePanel } from '../../../../web/src/features/proposals/components/lifecycle-panel';
import { renderWithClient } from '../../helpers/render';
import { mockFetch } from './fixtures/fetch-mock';
import { DESIGNER, proposalFixture, REVIEWER } from './fixtures/proposal-fixture';

const REQUIREMENTS: SessionUser = { id: 5, email: 'requirements@demo.longtail.test', displayName: 'Tomasz Rehn', role: 'member', projectRoles: [{ projectId: 1, role: 'requirements' }], createdAt: '2026-12-01T09:00:00.000Z', notify: true, noticesOff: [], disabledAt: null };
const MEMBERS = { 'GET /api/projects/1/members': () => ({ body: { items: [DESIGNER, REVIEWER, REQUIREMENTS] } }) };
const open = () => proposalFixture({ allowedEvents: ['decide', 'withdraw'] });

let fetchMock: ReturnType<typeof mockFetch>;

afterEach(() => {
  cleanup();
  expect(fetchMock.unmocked).toEqual([]);
  vi.unstubAllGlobals();
});

const show = (ui: React.ReactNode) => renderWithClient(<MemoryRouter>{ui}</MemoryRouter>);

describe('LifecyclePanel', () => {
  test('when a superseded ranking is shown, then it says the spec moved on and links the newer ranking', () => {
    fetchMock = mockFetch({ ...MEMBERS });
    show(<LifecyclePanel proposal={proposalFixture({ status: 'superseded', supersededById: 9, closedAt: '2026-12-04T19:29:00.000Z', allowedEvents: [] })} user={DESIGNER} />);

    expect(screen.getByRole('complementary', { name: 'Closed' }).textContent).toMatch(/Closed: the spec moved on\./);
    expect(screen.getByRole('link', { name: 'Open proposal #9' }).getAttribute('href')).toBe('/proposals/9');
    expect(screen.queryByRole('button', { name: /Withdraw/ })).toBeNull();
  });

  test('when a withdrawn ranking is shown, then who withdrew it and the reason are there', async () => {
    fetchMock = mockFetch({ ...MEMBERS });
    show(<LifecyclePanel proposal={proposalFixture({ status: 'withdrawn', closedById: DESIGNER.id, closedReason: 'Ranked on the wrong spec.', closedAt: '2026-12-04T19:29:00.000Z', allowedEvents: [] })} user={REVIEWER} />);

    const notice = screen.getByRole('complementary', { name: 'Withdrawn' });
    await waitFor(() => expect(notice.textContent).toMatch(/Withdrawn by Priya Valcourt/));
    expect(notice.textContent).toContain('“Ranked on the wrong spec.”');
  });

  test('when a designer withdraws without a reason, then the reason is asked for and nothing is sent; with one, it is sent', async () => {
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/proposals/2/withdrawal': () => ({ status: 201, body: proposalFixture({ status: 'withdrawn', allowedEvents: [] }) }) });
    const user = userEvent.setup();
    show(<LifecyclePanel proposal={open()} user={DESIGNER} />);

    await user.click(screen.getByRole('button', { name: 'Withdraw this proposal…' }));
    await user.click(screen.getByRole('button', { name: 'Withdraw with this reason' }));
    expect(screen.getByText(/a withdrawal needs a reason/)).toBeTruthy();
    expect(fetchMock.to('POST', '/api/proposals/2/withdrawal')).toHaveLength(0);

    await user.type(screen.getByRole('textbox', { name: /Reason/ }), '  Ranked on the wrong spec.  ');
    await user.click(screen.getByRole('button', { name: 'Withdraw with this reason' }));
    await waitFor(() => expect(fetchMock.to('POST', '/api/proposals/2/withdrawal')).toHaveLength(1));
    expect(fetchMock.to('POST', '/api/proposals/2/withdrawal')[0].body).toEqual({ reason: 'Ranked on the wrong spec.' });
  });

  test.each([
    ['a reviewer', REVIEWER, proposalFixture({ allowedEvents: ['decide', 'withdraw'] }), false],
    ['a systems engineer who did not ask for it', REQUIREMENTS, proposalFixture({ allowedEvents: ['decide', 'withdraw'] }), false],
    ['the systems engineer who asked for it', REQUIREMENTS, proposalFixture({ createdById: REQUIREMENTS.id, allowedEvents: ['decide', 'withdraw'] }), true],
    ['a designer, once approved', DESIGNER, proposalFixture({ status: 'approved', allowedEvents: [] }), false],
  ] as const)('when %s looks at it, then withdrawing is offered: %s', (_who, user, proposal, offered) => {
    fetchMock = mockFetch({ ...MEMBERS });
    show(<LifecyclePanel proposal={proposal} user={user} />);
    expect(screen.queryByRole('button', { name: 'Withdraw this proposal…' }) !== null).toBe(offered);
  });
});
