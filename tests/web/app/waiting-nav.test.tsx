// @vitest-environment jsdom
/**
 * The navigation's Waiting count: the total of what waits for the person, its words in the link's
 * name, linking to the home page's list; absent for someone with no project role; and moved by a
 * decision at once (the decision's write invalidates the counts), not at the next minute's refresh.
 */
import { QueryClientProvider } from '@tanstack/react-query';
import { configure, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRoutesStub } from 'react-router-dom';
import { describe, expect, test } from 'vitest';
import type { WaitingCounts } from '#shared/api/waiting';
import type { SessionUser } from '#shared/api/users';
import { AppShell } from '../../../web/src/components/layout/app-shell';
import { useDecideMutation } from '../../../web/src/features/proposals/api/decision-mutations';
import { authKeys } from '../../../web/src/lib/auth-queries';
import { json, useFetchStub } from '../helpers/fetch-stub';
import { testQueryClient } from '../helpers/render';

configure({ asyncUtilTimeout: 5000 });

const person = (projectRoles: SessionUser['projectRoles'], role: SessionUser['role'] = 'member'): SessionUser => ({
  id: 3, email: 'lead@example.test', displayName: 'Wren Halloway-Ito', role, projectRoles, createdAt: '2026-01-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null,
});
const LEAD = person([{ projectId: 1, role: 'designer' }, { projectId: 2, role: 'reviewer' }]);

/** Two rankings to decide and a decision sent back; one ranking fewer once the decision is in. */
const BEFORE: WaitingCounts = { counts: { decide: 2, rework: 1, review: 0, rank: 0 }, kinds: ['decide', 'rework', 'review'] };
const AFTER: WaitingCounts = { counts: { decide: 1, rework: 1, review: 0, rank: 0 }, kinds: ['decide', 'rework', 'review'] };
let decided = false;

const stub = useFetchStub((request) => {
  if (request.key === 'GET /api/auth/csrf') return json(200, { token: 'csrf-token' });
  if (request.key === 'GET /api/waiting/counts') return json(200, decided ? AFTER : BEFORE);
  if (request.key === 'POST /api/proposals/31/decision') {
    decided = true;
    return json(201, { id: 31, status: 'decided' });
  }
  return undefined;
});

/** A page that decides proposal 31, as the decision form does. */
function DecidePage() {
  const decide = useDecideMutation(31);
  return (
    <button type="button" onClick={() => decide.mutate({ kind: 'accept' })}>
      {decide.isSuccess ? 'Decided' : 'Accept the recommendation'}
    </button>
  );
}

function renderShell(user: SessionUser) {
  decided = false;
  const queryClient = testQueryClient();
  queryClient.setQueryData(authKeys.me(), user);
  const Stub = createRoutesStub([{ path: '/', Component: AppShell, children: [{ index: true, Component: DecidePage }] }]);
  render(
    <QueryClientProvider client={queryClient}>
      <Stub initialEntries={['/']} />
    </QueryClientProvider>,
  );
}

describe('the Waiting count in the navigation', () => {
  test('when work waits, then the link shows the total, says each kind in its name and leads to the home page’s list', async () => {
    renderShell(LEAD);
    const link = await screen.findByRole('link', { name: 'Waiting 3 : 2 rankings to decide, 1 sent back for a new decision' });
    expect(link.querySelector('[data-waiting-count]')!.textContent).toBe('3');
    expect(link.getAttribute('href')).toBe('/#waiting');
  });

  test('when a decision is made, then the count is asked for again and drops at once', async () => {
    renderShell(LEAD);
    await screen.findByRole('link', { name: /^Waiting 3 : 2 rankings/ });

    await userEvent.click(screen.getByRole('button', { name: 'Accept the recommendation' }));

    const link = await screen.findByRole('link', { name: 'Waiting 2 : 1 ranking to decide, 1 sent back for a new decision' });
    expect(link.querySelector('[data-waiting-count]')!.textContent).toBe('2');
    expect(stub.sent.filter((r) => r.key === 'GET /api/waiting/counts')).toHaveLength(2);
    expect(stub.sent.find((r) => r.key === 'POST /api/proposals/31/decision')?.body).toEqual({ kind: 'accept' });
  });

  test('when the person holds no project role, then there is no Waiting link and no count is asked for', async () => {
    renderShell(person([], 'admin'));
    expect(await screen.findByRole('navigation', { name: 'Main' })).toBeTruthy();
    expect(screen.queryByRole('link', { name: /Waiting/ })).toBeNull();
    expect(stub.sent.filter((r) => r.path.startsWith('/api/waiting'))).toEqual([]);
  });
});
