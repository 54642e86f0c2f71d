// @vitest-environment jsdom
/**
 * The search's results page: every kind's best hits under a heading with its count, each a link
 * to its page with the matched words marked and why it matched, and a way to the rest of a kind;
 * one kind paged through the address; the arrow keys moving between hits; what it says when
 * nothing matches or no query is given.
 */
import { QueryClientProvider } from '@tanstack/react-query';
import { configure, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRoutesStub, useLocation } from 'react-router-dom';
import { describe, expect, test } from 'vitest';
import type { SearchAnswer, SearchHit, SearchKind } from '#shared/api/search';
import type { SessionUser } from '#shared/api/users';
import { Component, ErrorBoundary, loader } from '../../../web/src/routes/search';
import { authKeys } from '../../../web/src/lib/auth-queries';
import { json, useFetchStub } from '../helpers/fetch-stub';
import { testQueryClient } from '../helpers/render';

configure({ asyncUtilTimeout: 5000 });

const VIEWER: SessionUser = { id: 3, email: 'priya@example.test', displayName: 'Priya Valcourt', role: 'member', projectRoles: [{ projectId: 1, role: 'designer' }], createdAt: '2026-01-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null };
const KESTREL = { id: 1, name: 'Kestrel load-cell amplifier' };
const marked = (before: string, word: string, after = '') => [
  { text: before, marked: false },
  { text: word, marked: true },
  { text: after, marked: false },
];
const hit = (kind: SearchKind, id: number, title: SearchHit['title'], fields: Partial<SearchHit> = {}): SearchHit => ({ kind, id, title, excerpt: null, project: kind === 'project' ? null : KESTREL, state: null, ...fields });
const COUNTS = { project: 1, spec: 1, proposal: 23, person: 0 };
const PROPOSAL = (id: number) => hit('proposal', id, marked(`#${id} `, 'Kestrel', ' rev B'), { state: 'approved' });
const OVERVIEW: SearchAnswer = {
  words: ['kestrel'],
  counts: COUNTS,
  groups: [
    { kind: 'project', items: [hit('project', 1, marked('', 'Kestrel', ' load-cell amplifier'))], total: 1, page: 1, pageSize: 5 },
    { kind: 'spec', items: [hit('spec', 7, marked('', 'Kestrel', ' rev B'), { excerpt: marked('Minimum CMRR: ', '78 dB') })], total: 1, page: 1, pageSize: 5 },
    { kind: 'proposal', items: [31, 30, 29, 28, 27].map(PROPOSAL), total: 23, page: 1, pageSize: 5 },
  ],
};

const stub = useFetchStub((request) => {
  const url = new URL(request.path, 'http://longtail.test');
  if (url.pathname !== '/api/search') return undefined;
  const q = url.searchParams.get('q');
  if (q === 'zzz') return json(200, { words: ['zzz'], counts: { project: 0, spec: 0, proposal: 0, person: 0 }, groups: [] });
  if (url.searchParams.get('kind') === 'proposal') {
    const page = Number(url.searchParams.get('page'));
    const ids = page === 1 ? Array.from({ length: 20 }, (_, i) => 40 - i) : [20, 19, 18];
    return json(200, { words: ['kestrel'], counts: COUNTS, groups: [{ kind: 'proposal', items: ids.map(PROPOSAL), total: 23, page, pageSize: 20 }] });
  }
  return json(200, OVERVIEW);
});

function Where() {
  const location = useLocation();
  return <output data-testid="where">{location.pathname + location.search}</output>;
}

function renderResults(entry: string) {
  const queryClient = testQueryClient();
  queryClient.setQueryData(authKeys.me(), VIEWER);
  const Stub = createRoutesStub([
    {
      path: '/search',
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

const searches = () => stub.sent.map((r) => new URL(r.path, 'http://longtail.test')).filter((u) => u.pathname === '/api/search');

describe('the search results page', () => {
  test('when opened with a query, then every kind with hits comes under its heading and count, each hit a link with its words marked and why it matched', async () => {
    renderResults('/search?q=kestrel');
    const specs = await screen.findByRole('region', { name: 'Specs : 1' });
    expect([...new Set(searches().map((u) => u.search))]).toEqual(['?q=kestrel&page=1&pageSize=5']);
    const link = within(specs).getByRole('link');
    expect(link.getAttribute('href')).toBe('/specs/7');
    expect([...link.querySelectorAll('mark')].map((m) => m.textContent)).toEqual(['Kestrel', '78 dB']);
    expect(link.textContent).toContain('Minimum CMRR: 78 dB');
    expect(link.textContent).toContain('Kestrel load-cell amplifier');

    const proposals = screen.getByRole('region', { name: 'Proposals : 23' });
    expect(within(proposals).getAllByRole('link', { name: /^#\d+ Kestrel rev B/ })).toHaveLength(5);
    expect(within(proposals).getAllByText('Approved')).toHaveLength(5);
    expect(within(proposals).getByRole('link', { name: 'All 23 proposals' }).getAttribute('href')).toBe('/search?q=kestrel&kind=proposal');
    const kinds = screen.getByRole('navigation', { name: 'Kinds of results' });
    expect(within(kinds).getAllByRole('link').map((a) => a.textContent)).toEqual(['Everything 25', 'Projects 1', 'Specs 1', 'Proposals 23']);
  });

  test('when one kind is opened, then its first 20 come and Next asks for the second page through the address', async () => {
    renderResults('/search?q=kestrel&kind=proposal');
    const list = await screen.findByRole('list', { name: 'Proposals' });
    expect(within(list).getAllByRole('link')).toHaveLength(20);
    expect(within(screen.getByRole('navigation', { name: 'Kinds of results' })).getByRole('link', { current: 'page' }).textContent).toBe('Proposals 23');

    await userEvent.click(screen.getByRole('button', { name: /Next/ }));

    await waitFor(() => expect(screen.getByTestId('where').textContent).toBe('/search?q=kestrel&kind=proposal&page=2'));
    expect(await screen.findByRole('link', { name: /^#18 Kestrel/ })).toBeTruthy();
    expect(searches().map((u) => u.search)).toContain('?q=kestrel&kind=proposal&page=2&pageSize=20');
  });

  test('when the arrow keys are pressed on a hit, then the cursor moves to the next and the previous hit across the kinds', async () => {
    renderResults('/search?q=kestrel');
    const first = await screen.findByRole('link', { name: /^Kestrel load-cell amplifier/ });
    first.focus();
    await userEvent.keyboard('{ArrowDown}');
    expect(document.activeElement?.getAttribute('href')).toBe('/specs/7');
    await userEvent.keyboard('{ArrowDown}');
    expect(document.activeElement?.getAttribute('href')).toBe('/proposals/31');
    await userEvent.keyboard('{ArrowUp}{ArrowUp}{ArrowUp}');
    expect(document.activeElement?.getAttribute('href')).toBe('/projects/1');
  });

  test('when nothing matches, then the page says so and how the search reads a query', async () => {
    renderResults('/search?q=zzz');
    expect(await screen.findByText('Nothing you can see matches “zzz”')).toBeTruthy();
    expect(screen.getByText(/a number and its unit go together/)).toBeTruthy();
  });

  test('when no query is given, then nothing is asked and the page points to the box', async () => {
    renderResults('/search');
    expect(await screen.findByText('Type what you are looking for in the search box at the top')).toBeTruthy();
    expect(searches()).toEqual([]);
  });
});
