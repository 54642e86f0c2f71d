// @vitest-environment jsdom
/**
 * "Waiting for you" on the home page: a group per kind the person's roles wait on, with its count,
 * its items oldest first (age, link, project, who put it there), paged; nothing for someone with
 * no project role; a failed count shown in place while the projects still show.
 */
import { QueryClientProvider } from '@tanstack/react-query';
import { configure, render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRoutesStub } from 'react-router-dom';
import { describe, expect, test } from 'vitest';
import type { WaitingCounts, WaitingItem } from '#shared/api/waiting';
import type { SessionUser } from '#shared/api/users';
import { Component, loader } from '../../../web/src/routes/home';
import { authKeys } from '../../../web/src/lib/auth-queries';
import { json, useFetchStub } from '../helpers/fetch-stub';
import { testQueryClient } from '../helpers/render';

configure({ asyncUtilTimeout: 5000 });

const DAY_MS = 86_400_000;
/** The moment the fixtures' ages count from. */
const NOW = Date.now();
const person = (projectRoles: SessionUser['projectRoles'], role: SessionUser['role'] = 'member'): SessionUser => ({
  id: 3, email: 'priya@example.test', displayName: 'Priya Valcourt', role, projectRoles, createdAt: '2026-01-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null,
});
const DESIGNER = person([{ projectId: 1, role: 'designer' }, { projectId: 2, role: 'designer' }]);
const PROJECTS = { items: [{ id: 1, name: 'Kestrel load-cell amplifier', description: '', createdById: 1, createdAt: '2026-01-01T00:00:00Z' }] };

/** Twelve rankings to decide, the oldest 12 days ago and one a day after; one decision of the person's, sent back 5 hours ago. */
const decideItem = (n: number): WaitingItem => ({
  kind: 'decide',
  since: new Date(NOW - (13 - n) * DAY_MS - 60_000).toISOString(),
  project: { id: 1, name: 'Kestrel load-cell amplifier' },
  spec: { id: 40 + n, title: `Kestrel channel ${n}`, version: 2 },
  proposalId: 100 + n,
  by: { id: 2, displayName: 'Tomasz Rehn' },
  yours: false,
});
const REWORK: WaitingItem = {
  kind: 'rework', since: new Date(NOW - 5 * 3_600_000 - 60_000).toISOString(), project: { id: 2, name: 'Marram biosignal front end' },
  spec: { id: 9, title: 'Marram electrode pair', version: 1 }, proposalId: 4, by: { id: 5, displayName: 'Samir Edelstein' }, yours: true,
};

let counts: { status: number; body: unknown } = { status: 200, body: { counts: { decide: 12, rework: 1, review: 0, rank: 0 }, kinds: ['decide', 'rework'] } satisfies WaitingCounts };

const stub = useFetchStub((request) => {
  const url = new URL(request.path, 'http://longtail.test');
  if (url.pathname === '/api/projects') return json(200, PROJECTS);
  if (url.pathname === '/api/waiting/counts') return json(counts.status, counts.body);
  if (url.pathname === '/api/waiting') {
    const kind = url.searchParams.get('kind');
    const page = Number(url.searchParams.get('page'));
    const pageSize = Number(url.searchParams.get('pageSize'));
    if (kind === 'decide') return json(200, { items: Array.from({ length: 12 }, (_, i) => decideItem(i + 1)).slice((page - 1) * pageSize, page * pageSize), total: 12, page, pageSize });
    if (kind === 'rework') return json(200, { items: [REWORK], total: 1, page, pageSize });
    if (kind === 'review') return json(200, { items: [{ ...REWORK, kind: 'review', yours: false, by: { id: 3, displayName: 'Wren Halloway-Ito' } }], total: 1, page, pageSize });
  }
  return undefined;
});

function renderHome(user: SessionUser) {
  const queryClient = testQueryClient();
  queryClient.setQueryData(authKeys.me(), user);
  const Stub = createRoutesStub([{ path: '/', Component, loader: loader(queryClient), HydrateFallback: () => <p>Opening…</p> }]);
  render(
    <QueryClientProvider client={queryClient}>
      <Stub initialEntries={['/']} />
    </QueryClientProvider>,
  );
}

const waitingRequests = () => stub.sent.map((r) => new URL(r.path, 'http://longtail.test')).filter((u) => u.pathname === '/api/waiting');

describe('Waiting for you', () => {
  test('when a designer opens the home page, then each kind their role waits on has its heading and count, and its items oldest first', async () => {
    counts = { status: 200, body: { counts: { decide: 12, rework: 1, review: 0, rank: 0 }, kinds: ['decide', 'rework'] } };
    renderHome(DESIGNER);
    const section = await screen.findByRole('region', { name: /Waiting for you/ });
    expect(within(section).getByRole('heading', { level: 2 }).textContent).toBe('Waiting for you13 in all');
    const decide = within(section).getByRole('region', { name: /^Rankings to decide\W+12$/ });
    const rows = within(decide).getAllByRole('listitem');
    expect(rows).toHaveLength(10);
    const first = within(rows[0]).getByRole('link');
    expect(first.textContent).toBe('#101 Kestrel channel 1v2');
    expect(first.getAttribute('href')).toBe('/proposals/101');
    expect(rows[0].textContent).toContain('waiting 12 days');
    expect(rows[0].textContent).toContain('Kestrel load-cell amplifier');
    expect(rows[0].textContent).toContain('Asked for by Tomasz Rehn');
    expect(within(rows[0]).getByText('12 days').closest('time')!.getAttribute('dateTime')).toBe(decideItem(1).since);
    const rework = within(section).getByRole('region', { name: /^Sent back for a new decision\W+1$/ });
    const reworkRow = within(rework).getByRole('listitem');
    expect(reworkRow.textContent).toContain('waiting 5 h');
    expect(reworkRow.textContent).toContain('Sent back by Samir Edelstein');
    expect(within(reworkRow).getByText('your decision')).toBeTruthy();
  });

  test('when a kind holds more than a page, then the next page is asked for and shown', async () => {
    renderHome(DESIGNER);
    const decide = await screen.findByRole('region', { name: /^Rankings to decide\W+12$/ });
    expect(within(decide).getByText('1–10 of 12')).toBeTruthy();

    await userEvent.click(within(decide).getByRole('button', { name: /Next/ }));

    expect(await within(decide).findByText('11–12 of 12')).toBeTruthy();
    expect(within(decide).getAllByRole('link').map((a) => a.getAttribute('href'))).toEqual(['/proposals/111', '/proposals/112']);
    expect(waitingRequests().filter((u) => u.searchParams.get('kind') === 'decide').map((u) => u.searchParams.get('page')).at(-1)).toBe('2');
  });

  test('when a kind the role waits on has nothing, then it says so and no list is asked for', async () => {
    counts = { status: 200, body: { counts: { decide: 0, rework: 0, review: 3, rank: 0 }, kinds: ['decide', 'rework', 'review'] } };
    renderHome(person([{ projectId: 1, role: 'designer' }, { projectId: 2, role: 'reviewer' }]));
    const decide = await screen.findByRole('region', { name: /^Rankings to decide\W+0$/ });
    expect(decide.textContent).toContain('No ranking waits for a decision in your projects.');
    expect(waitingRequests().map((u) => u.searchParams.get('kind'))).not.toContain('decide');
    expect(await screen.findByText('Decided by Wren Halloway-Ito')).toBeTruthy();
    counts = { status: 200, body: { counts: { decide: 12, rework: 1, review: 0, rank: 0 }, kinds: ['decide', 'rework'] } };
  });

  test('when the person holds no project role (an administrator), then there is no waiting list and nothing is asked', async () => {
    renderHome(person([], 'admin'));
    expect(await screen.findByRole('heading', { name: 'Your projects' })).toBeTruthy();
    expect(screen.queryByRole('region', { name: /Waiting for you/ })).toBeNull();
    expect(stub.sent.filter((r) => r.path.startsWith('/api/waiting'))).toEqual([]);
  });

  test('when the counts cannot be fetched, then the section says so with a retry and the projects still show', async () => {
    counts = { status: 503, body: { error: 'The database is busy.', code: 'busy' } };
    renderHome(DESIGNER);
    const section = await screen.findByRole('region', { name: /Waiting for you/ });
    expect((await within(section).findByRole('alert')).textContent).toContain('The database is busy.');
    expect(within(section).getByRole('button', { name: 'Try again' })).toBeTruthy();
    expect(screen.getByRole('link', { name: /Kestrel load-cell amplifier/ })).toBeTruthy();
    counts = { status: 200, body: { counts: { decide: 12, rework: 1, review: 0, rank: 0 }, kinds: ['decide', 'rework'] } };
  });
});
