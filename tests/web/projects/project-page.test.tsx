// @vitest-environment jsdom
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, configure, render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRoutesStub, useLocation } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, test, vi } from 'vitest';
import type { Role } from '#shared/workflow/roles';
import { authKeys } from '../../../web/src/lib/auth-queries';
import type { ProposalSummary } from '#shared/api/proposals';
import type { SessionUser } from '#shared/api/users';
import { Component, ErrorBoundary, loader } from '../../../web/src/routes/project';
import { CurrentDesignCell } from '../../../web/src/features/projects/components/proposals-table';

// Route modules load lazily on first use: give the first render of a file time.
configure({ asyncUtilTimeout: 5000 });

const TOTAL_PROPOSALS = 134;
const STATES = ['ranked', 'decided', 'returned', 'approved'] as const;

function proposal(id: number): ProposalSummary {
  return {
    id, projectId: 1, specId: 7, specVersionId: 70 + (id % 2), specVersionNumber: 1 + (id % 2), specTitle: 'Strain bridge receiver', engineVersion: '1.0.0', rulesetVersion: 'abc',
    recommendedTopology: id % 3 === 0 ? null : 'degenerated-mirror', status: STATES[id % 4], supersededById: null, closedReason: null, closedById: null, closedAt: null, createdById: 3,
    createdAt: '2026-11-01T10:00:00.000Z', updatedAt: '2026-11-02T10:00:00.000Z',
  };
}

/** The API this page talks to; anything else is recorded and fails the test. */
function answer(url: URL): unknown {
  if (url.pathname === '/api/projects/1') return { id: 1, name: 'Kestrel', description: 'Load-cell amplifier', createdById: 1, createdAt: '2026-11-01T00:00:00Z' };
  if (url.pathname === '/api/projects/1/specs')
    return { items: [{ id: 7, projectId: 1, title: 'Strain bridge receiver', latestVersion: 2, createdById: 2, createdAt: '2026-11-01T00:00:00Z', updatedAt: '2026-11-03T00:00:00Z' }] };
  if (url.pathname === '/api/projects/1/members') return { items: [] };
  if (url.pathname === '/api/projects/1/devices') return { items: [], total: 0, page: 1, pageSize: 20 };
  if (url.pathname === '/api/projects/1/proposals') {
    const page = Number(url.searchParams.get('page'));
    const pageSize = Number(url.searchParams.get('pageSize'));
    const first = (page - 1) * pageSize + 1;
    const count = Math.max(0, Math.min(pageSize, TOTAL_PROPOSALS - first + 1));
    return { items: Array.from({ length: count }, (_, i) => proposal(TOTAL_PROPOSALS - first - i + 1)), total: TOTAL_PROPOSALS, page, pageSize };
  }
  return undefined;
}

let requests: URL[] = [];
let unmocked: string[] = [];

beforeEach(() => {
  // jsdom has no CSS.escape; user-event uses it to find a radio group's next button.
  vi.stubGlobal('CSS', { escape: (value: string) => value.replace(/[^\w-]/g, (c) => `\\${c}`) });
  requests = [];
  unmocked = [];
  vi.stubGlobal('fetch', async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = new URL(String(input), 'http://longtail.test');
    requests.push(url);
    if (url.pathname.startsWith('/api/projects/99')) return new Response(JSON.stringify({ error: 'No such project.', code: 'project-not-found' }), { status: 404 });
    const body = (init?.method ?? 'GET') === 'GET' ? answer(url) : undefined;
    if (body === undefined) {
      unmocked.push(`${init?.method ?? 'GET'} ${url.pathname}${url.search}`);
      return new Response(JSON.stringify({ error: 'not mocked' }), { status: 599 });
    }
    return new Response(JSON.stringify(body), { status: 200, headers: { 'Content-Type': 'application/json' } });
  });
});

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  expect(unmocked, 'requests nobody mocked').toEqual([]);
});

/** Where the router is now, so the test can read the URL. */
function LocationProbe() {
  const location = useLocation();
  return <output data-testid="location">{location.pathname + location.search}</output>;
}

function renderProjectPage(role: Role, entry = '/projects/1') {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  // The role is held in this project (id 1); the administrator holds none here.
  const user: SessionUser = role === 'admin' ? { id: 3, email: 'admin@example.test', displayName: 'Pat Example', role: 'admin', projectRoles: [], createdAt: '2026-01-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null } : { id: 3, email: `${role}@example.test`, displayName: 'Pat Example', role: 'member', projectRoles: [{ projectId: 1, role }], createdAt: '2026-01-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null };
  queryClient.setQueryData(authKeys.me(), user);
  const Stub = createRoutesStub([
    {
      path: '/projects/:projectId',
      Component: () => (
        <>
          <Component />
          <LocationProbe />
        </>
      ),
      loader: loader(queryClient),
      ErrorBoundary,
      HydrateFallback: () => <p>Loading the project…</p>,
    },
  ]);
  render(
    <QueryClientProvider client={queryClient}>
      <Stub initialEntries={[entry]} />
    </QueryClientProvider>,
  );
}

const proposalRequests = () => requests.filter((u) => u.pathname === '/api/projects/1/proposals' && u.searchParams.get('pageSize') === '20');

describe('project page', () => {
  test('when a status is chosen, then the proposals are fetched with that status and the URL says so', async () => {
    renderProjectPage('reviewer');
    const filter = await screen.findByRole('group', { name: 'Show proposals' });
    expect(proposalRequests().at(-1)?.searchParams.has('status')).toBe(false);

    await userEvent.click(within(filter).getByRole('radio', { name: /Awaiting review/ }));

    expect(await within(filter).findByRole('radio', { name: /Awaiting review/, checked: true })).toBeTruthy();
    expect(proposalRequests().at(-1)?.searchParams.get('status')).toBe('decided');
    expect(screen.getByTestId('location').textContent).toBe('/projects/1?status=decided');
  });

  test('when arrow keys move along the filter, then each segment is chosen in turn', async () => {
    renderProjectPage('reviewer');
    const all = await screen.findByRole('radio', { name: 'All' });
    all.focus();
    await userEvent.keyboard('{ArrowRight}');
    expect(await screen.findByRole('radio', { name: /Awaiting decision/, checked: true })).toBeTruthy();
    expect(screen.getByTestId('location').textContent).toBe('/projects/1?status=ranked');
  });

  test('when the second page is open, then it says which rows of how many, and next moves on', async () => {
    renderProjectPage('designer', '/projects/1?page=2');
    expect(await screen.findByText('21–40 of 134')).toBeTruthy();
    expect(proposalRequests().at(-1)?.searchParams.get('page')).toBe('2');

    await userEvent.click(screen.getByRole('button', { name: /Next/ }));

    expect(await screen.findByText('41–60 of 134')).toBeTruthy();
    expect(screen.getByTestId('location').textContent).toBe('/projects/1?page=3');
  });

  test('when on the last page, then next is disabled and the count ends at the total', async () => {
    renderProjectPage('designer', '/projects/1?page=7');
    expect(await screen.findByText('121–134 of 134')).toBeTruthy();
    expect((screen.getByRole('button', { name: /Next/ }) as HTMLButtonElement).disabled).toBe(true);
  });

  test('when the proposals are listed, then each row joins the spec title, version and topology in words', async () => {
    renderProjectPage('designer');
    const row = (await screen.findByRole('link', { name: 'Proposal #134' })).closest('tr')!;
    expect(within(row).getByText('Strain bridge receiver')).toBeTruthy();
    expect(within(row).getByText('Degenerated mirror')).toBeTruthy();
    expect(await within(row).findByText('v1')).toBeTruthy();
  });

  test.each([
    ['requirements', true],
    ['designer', false],
    ['reviewer', false],
    ['admin', false],
  ] as const)('when %s opens the project, then "New spec" is shown: %s', async (role, shown) => {
    if (role === 'admin') vi.stubGlobal('fetch', withUsers(globalThis.fetch));
    renderProjectPage(role);
    await screen.findByRole('heading', { name: 'Kestrel' });
    expect(screen.queryByRole('link', { name: 'New spec' }) !== null).toBe(shown);
  });

  test('when the project is not there (or not yours), then "Not found" shows in place of the page', async () => {
    renderProjectPage('designer', '/projects/99');
    expect(await screen.findByRole('heading', { name: 'Not found' })).toBeTruthy();
    expect(screen.getByText('No such project.')).toBeTruthy();
  });

  test('when a designer opens the project, then what waits for them is counted from one-row pages', async () => {
    renderProjectPage('designer');
    const hint = await screen.findByRole('region', { name: 'What needs you' });
    expect(await within(hint).findByText(/134 proposals wait for your decision/)).toBeTruthy();
    const counts = requests.filter((u) => u.searchParams.get('pageSize') === '1').map((u) => u.searchParams.get('status'));
    expect(counts.sort()).toEqual(['ranked', 'returned']);
  });
});

/** An admin's page also lists every account, to add members from. */
function withUsers(inner: typeof fetch): typeof fetch {
  return async (input, init) => {
    if (String(input) === '/api/users') return new Response(JSON.stringify({ items: [] }), { status: 200 });
    return inner(input, init);
  };
}

describe('the project list names each proposal’s current design', () => {
  const summary = (overrides: Partial<ProposalSummary>): ProposalSummary => ({
    id: 140,
    projectId: 1,
    specId: 2,
    specVersionId: 3,
    engineVersion: '1.0.0',
    rulesetVersion: 'r'.repeat(64),
    recommendedTopology: 'degenerated-mirror',
    status: 'approved',
    supersededById: null,
    closedReason: null,
    closedById: null,
    closedAt: null,
    createdById: 1,
    createdAt: '2026-03-01T00:00:00.000Z',
    updatedAt: '2026-03-02T00:00:00.000Z',
    ...overrides,
  });

  test('when a chosen cascode is signed off, then the cascode is named, with the recommendation and the reason beside it', () => {
    render(
      <CurrentDesignCell
        proposal={summary({
          currentDesign: { basis: 'decision', topology: 'cascode', ownValues: false, decisionId: 9, decisionKind: 'choose', recommended: 'degenerated-mirror', differsFromRecommendation: true, reason: 'Long cable run.' },
        })}
      />,
    );
    expect(screen.getByText('Cascode mirror')).toBeTruthy();
    expect(screen.getByText('(signed off)')).toBeTruthy();
    expect(screen.getByText(/recommended: Degenerated mirror · why: Long cable run\./)).toBeTruthy();
  });

  test('when nothing is decided, then the recommendation is the design, marked as such', () => {
    render(<CurrentDesignCell proposal={summary({ status: 'ranked', currentDesign: { basis: 'recommendation', topology: 'degenerated-mirror', ownValues: false, decisionId: null, decisionKind: null, recommended: 'degenerated-mirror', differsFromRecommendation: false, reason: null } })} />);
    expect(screen.getByText('Degenerated mirror')).toBeTruthy();
    expect(screen.getByText('(recommended)')).toBeTruthy();
    expect(screen.queryByText(/why:/)).toBeNull();
  });
});

