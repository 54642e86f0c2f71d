// @vitest-environment jsdom
/**
 * A project's activity page: each event in the record's words with who, the spec and proposal it
 * concerns (linked), the quoted reason and the state it moved; the filter sentence (kind, person)
 * and the page kept in the address and sent to the API; the CSV link carrying the same filter.
 */
import { QueryClientProvider } from '@tanstack/react-query';
import { configure, render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRoutesStub, useLocation } from 'react-router-dom';
import { describe, expect, test } from 'vitest';
import type { ActivityEvent } from '#shared/api/activity';
import type { SessionUser } from '#shared/api/users';
import { Component, ErrorBoundary, loader } from '../../../web/src/routes/project-activity';
import { authKeys } from '../../../web/src/lib/auth-queries';
import { json, useFetchStub } from '../helpers/fetch-stub';
import { testQueryClient } from '../helpers/render';

configure({ asyncUtilTimeout: 5000 });

const VIEWER: SessionUser = { id: 3, email: 'samir@example.test', displayName: 'Samir Edelstein', role: 'member', projectRoles: [{ projectId: 1, role: 'reviewer' }], createdAt: '2026-01-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null };
const MEMBERS = [
  { id: 2, email: 'priya@example.test', displayName: 'Priya Valcourt', role: 'member', createdAt: '2026-01-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null, projectRole: 'designer' },
  { id: 3, email: 'samir@example.test', displayName: 'Samir Edelstein', role: 'member', createdAt: '2026-01-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null, projectRole: 'reviewer' },
];

const event = (id: number, fields: Partial<ActivityEvent>): ActivityEvent => ({
  id, at: '2026-03-02T10:00:00.000Z', actorId: 2, action: 'proposal.ranked', entityType: 'proposal', entityId: 31, projectId: 1, proposalId: 31, beforeId: null, afterId: 31,
  details: {}, actor: { id: 2, displayName: 'Priya Valcourt' }, spec: { id: 7, title: 'Kestrel rev C' }, records: {}, ...fields,
});
const DECIDED = event(60, { action: 'proposal.decided', entityType: 'decision', entityId: 5, details: { kind: 'choose', topology: 'wilson', from: 'ranked', to: 'decided' }, records: { decision: { kind: 'choose', topology: 'wilson', reason: 'More headroom at −40 °C.' } } });
const RETURNED = event(61, { action: 'proposal.returned', entityType: 'review', entityId: 8, actorId: 3, actor: { id: 3, displayName: 'Samir Edelstein' }, details: { verdict: 'return', topology: 'wilson', from: 'decided', to: 'returned' }, records: { review: { comment: 'Check the rails.' } } });
const SPEC = event(59, { action: 'spec.version-created', entityType: 'spec', entityId: 7, proposalId: null, actorId: 4, actor: null, details: { version: 2, changes: 3 } });
const ALL = [RETURNED, DECIDED, SPEC];
const TOTAL = 53;

/** When set, the answers to the activity wait for it (a slow server). */
let hold: Promise<void> | null = null;

const stub = useFetchStub(async (request) => {
  const url = new URL(request.path, 'http://longtail.test');
  if (hold && url.pathname === '/api/projects/1/activity') await hold;
  if (url.pathname === '/api/projects/1') return json(200, { id: 1, name: 'Kestrel load-cell amplifier', description: '', createdById: 1, createdAt: '2026-01-01T00:00:00Z' });
  if (url.pathname === '/api/projects/1/members') return json(200, { items: MEMBERS });
  if (url.pathname === '/api/projects/1/activity') {
    const page = Number(url.searchParams.get('page'));
    const pageSize = Number(url.searchParams.get('pageSize'));
    if (url.searchParams.get('kind') === 'bench') return json(200, { items: [], total: 0, page, pageSize });
    if (url.searchParams.get('kind') === 'decisions') return json(200, { items: [DECIDED], total: 1, page, pageSize });
    return json(200, { items: ALL, total: TOTAL, page, pageSize });
  }
  return undefined;
});

function Where() {
  const location = useLocation();
  return <output data-testid="where">{location.pathname + location.search}</output>;
}

function renderActivity(entry = '/projects/1/activity') {
  const queryClient = testQueryClient();
  queryClient.setQueryData(authKeys.me(), VIEWER);
  const Stub = createRoutesStub([
    {
      path: '/projects/:projectId/activity',
      Component: () => (
        <>
          <Component />
          <Where />
        </>
      ),
      loader: loader(queryClient),
      ErrorBoundary,
      HydrateFallback: () => <p>Opening…</p>,
    },
  ]);
  render(
    <QueryClientProvider client={queryClient}>
      <Stub initialEntries={[entry]} />
    </QueryClientProvider>,
  );
}

const activityRequests = () => stub.sent.map((r) => new URL(r.path, 'http://longtail.test')).filter((u) => u.pathname === '/api/projects/1/activity');

describe('project activity page', () => {
  test('when opened, then each event says who did what, links its spec and proposal, quotes its words and shows the state it moved', async () => {
    renderActivity();
    const list = await screen.findByRole('list', { name: 'Events, newest first' });
    const [returned, decided, spec] = within(list).getAllByRole('listitem');
    expect(returned.textContent).toContain('Samir Edelstein (you) sent the decided design (Wilson mirror) back for rework');
    expect(returned.textContent).toContain('Comment: Check the rails.');
    expect(within(returned).getByText('Check the rails.').tagName).toBe('Q');
    expect(decided.textContent).toContain('Priya Valcourt decided: chose another ranked option (Wilson mirror)');
    expect(within(decided).getByText('More headroom at −40 °C.').tagName).toBe('Q');
    expect(within(decided).getByRole('link', { name: 'Kestrel rev C' }).getAttribute('href')).toBe('/specs/7');
    expect(within(decided).getByRole('link', { name: 'Proposal #31' }).getAttribute('href')).toBe('/proposals/31');
    expect(within(decided).getByText('Awaiting decision')).toBeTruthy();
    expect(within(decided).getByText('Awaiting review')).toBeTruthy();
    // A spec's event has no proposal; an actor no longer known is named by number.
    expect(spec.textContent).toContain('Person #4 wrote version 2 of the spec: 3 fields changed');
    expect(within(spec).queryByRole('link', { name: /Proposal/ })).toBeNull();
    expect(within(spec).getByText('2 Mar 2026, 10:00 UTC').closest('time')!.getAttribute('dateTime')).toBe('2026-03-02T10:00:00.000Z');
    expect(screen.getByText('1–25 of 53')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Every event as CSV' }).getAttribute('href')).toBe('/api/projects/1/activity.csv');
  });

  test('when a kind and a person are chosen, then the address, the API query and the CSV link carry them, from page 1', async () => {
    renderActivity('/projects/1/activity?page=2');
    const kind = await screen.findByRole('combobox', { name: 'Show' });
    expect(activityRequests().at(-1)!.searchParams.get('page')).toBe('2');

    await userEvent.selectOptions(kind, 'decisions');
    await userEvent.selectOptions(screen.getByRole('combobox', { name: 'by' }), 'Priya Valcourt');

    expect(screen.getByTestId('where').textContent).toBe('/projects/1/activity?kind=decisions&person=2');
    const last = activityRequests().at(-1)!;
    expect(Object.fromEntries(last.searchParams)).toEqual({ actor: '2', kind: 'decisions', page: '1', pageSize: '25' });
    expect(screen.getByRole('link', { name: 'These events as CSV' }).getAttribute('href')).toBe('/api/projects/1/activity.csv?actor=2&kind=decisions');
    expect(await screen.findByText('1–1 of 1')).toBeTruthy();
  });

  test('when a person is chosen while the page for a chosen kind still loads, then the address keeps both choices', async () => {
    renderActivity();
    const kind = await screen.findByRole('combobox', { name: 'Show' });
    let answer = () => {};
    hold = new Promise<void>((resolve) => (answer = resolve));

    await userEvent.selectOptions(kind, 'decisions');
    await userEvent.selectOptions(screen.getByRole('combobox', { name: 'by' }), 'Priya Valcourt');
    hold = null;
    answer();

    await screen.findByText('1–1 of 1');
    expect(screen.getByTestId('where').textContent).toBe('/projects/1/activity?kind=decisions&person=2');
    expect(Object.fromEntries(activityRequests().at(-1)!.searchParams)).toEqual({ actor: '2', kind: 'decisions', page: '1', pageSize: '25' });
  });

  test('when next is pressed, then the next page is asked for and the address keeps it', async () => {
    renderActivity();
    await screen.findByText('1–25 of 53');
    await userEvent.click(screen.getByRole('button', { name: /Next/ }));
    expect(await screen.findByText('26–50 of 53')).toBeTruthy();
    expect(screen.getByTestId('where').textContent).toBe('/projects/1/activity?page=2');
    expect(activityRequests().at(-1)!.searchParams.get('page')).toBe('2');
  });

  test('when no event matches the filter, then it says so and how to widen it', async () => {
    renderActivity('/projects/1/activity?kind=bench');
    expect(await screen.findByText('No event matches')).toBeTruthy();
    expect(screen.getByText('Choose another kind of event or person above.')).toBeTruthy();
  });
});
