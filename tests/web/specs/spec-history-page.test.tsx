// @vitest-environment jsdom
/**
 * The spec history page: the versions as a timeline with their change notes, and the comparison
 * chosen in one sentence ("the changes made in version 3 since version 2") or by one press on a
 * version ("What version 2 changed"); no columns of radio buttons. The server is a fetch stub
 * with an invented spec.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, configure, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRoutesStub } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, test, vi } from 'vitest';
import schema from '#shared/schema/spec.schema.json';
import { authKeys } from '../../../web/src/lib/auth-queries';
import type { SpecVersion } from '#shared/api/specs';
import type { SessionUser } from '#shared/api/users';
import { Component, ErrorBoundary, loader } from '../../../web/src/routes/spec-history';

configure({ asyncUtilTimeout: 5000 });

const at = '2026-12-01T09:00:00.000Z';
const payload = (max: number, marginDb: number) => ({ title: 'Tarn probe', supply: { positiveV: 9, negativeV: -9 }, gain: { target: 20, tolerancePercent: 10, output: 'differential' }, cmrr: { minDb: 80, atFrequencyHz: 50, marginDb, minYieldPercent: 95 }, temperatureC: { min: 0, max } });
const VERSIONS: SpecVersion[] = [
  { id: 71, specId: 7, version: 1, title: 'Tarn probe', payload: payload(70, 3) as never, note: null, createdById: 2, createdAt: at },
  { id: 72, specId: 7, version: 2, title: 'Tarn probe', payload: payload(70, 6) as never, note: 'Rejection margin raised to 6 dB after the bench run.', createdById: 2, createdAt: at },
  { id: 73, specId: 7, version: 3, title: 'Tarn probe', payload: payload(50, 6) as never, note: 'Indoor use only.', createdById: 2, createdAt: at },
];
const DIFFS: Record<string, unknown> = {
  '2-3': { from: 2, to: 3, changes: [{ path: '/temperatureC/max', kind: 'changed', before: 70, after: 50 }] },
  '1-3': { from: 1, to: 3, changes: [{ path: '/cmrr/marginDb', kind: 'changed', before: 3, after: 6 }, { path: '/temperatureC/max', kind: 'changed', before: 70, after: 50 }] },
  '1-2': { from: 1, to: 2, changes: [{ path: '/cmrr/marginDb', kind: 'changed', before: 3, after: 6 }] },
};

let diffs: string[] = [];
let unmocked: string[] = [];

function answer(url: URL): unknown {
  if (url.pathname === '/api/specs/7') return { id: 7, projectId: 1, title: 'Tarn probe', latestVersion: 3, createdById: 2, createdAt: at, updatedAt: at, latest: VERSIONS[2] };
  if (url.pathname === '/api/specs/7/versions') return { items: VERSIONS };
  if (url.pathname === '/api/schema/spec') return schema;
  if (url.pathname === '/api/projects/1/members') return { items: [{ id: 2, email: 'r@example.test', displayName: 'Tomasz Rehn', role: 'requirements', createdAt: at, notify: true, noticesOff: [], disabledAt: null }] };
  // The project's newest proposals: version 3 ranked (#92), version 1 ranked (#90), version 2 never; one of another spec.
  if (url.pathname === '/api/projects/1/proposals' && url.searchParams.get('pageSize') === '100') {
    const summary = (id: number, specId: number, specVersionNumber: number) => ({ id, specId, specVersionNumber, specTitle: 'Tarn probe', projectId: 1, status: 'ranked' });
    return { items: [summary(93, 8, 3), summary(92, 7, 3), summary(90, 7, 1)], total: 3, page: 1, pageSize: 100 };
  }
  if (url.pathname === '/api/specs/7/diff') {
    const key = `${url.searchParams.get('from')}-${url.searchParams.get('to')}`;
    diffs.push(key);
    return DIFFS[key];
  }
  return undefined;
}

beforeEach(() => {
  diffs = [];
  unmocked = [];
  vi.stubGlobal('fetch', async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = new URL(String(input), 'http://longtail.test');
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

function renderHistory() {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const user: SessionUser = { id: 3, email: 'd@example.test', displayName: 'Pat Example', role: 'member', projectRoles: [{ projectId: 1, role: 'designer' }], createdAt: at, notify: true, noticesOff: [], disabledAt: null };
  queryClient.setQueryData(authKeys.me(), user);
  const Stub = createRoutesStub([{ path: '/specs/:specId/history', Component, loader: loader(queryClient), ErrorBoundary, HydrateFallback: () => <p>Loading…</p> }]);
  render(
    <QueryClientProvider client={queryClient}>
      <Stub initialEntries={['/specs/7/history']} />
    </QueryClientProvider>,
  );
}

describe('spec history page', () => {
  test('when it opens, then the versions are a timeline with their notes, the latest change is shown, and no radio buttons pick versions', async () => {
    renderHistory();

    const timeline = await screen.findByRole('list', { name: 'Versions, newest first' });
    const items = within(timeline).getAllByRole('listitem');
    expect(items.map((li) => li.textContent?.match(/Version \d/)?.[0])).toEqual(['Version 3', 'Version 2', 'Version 1']);
    expect(items[1].textContent).toContain('“Rejection margin raised to 6 dB after the bench run.”');
    await waitFor(() => expect(diffs).toEqual(['2-3']));
    expect(await screen.findByText('1 field differs between version 2 and version 3.')).toBeTruthy();
    expect(screen.getByRole('list', { name: 'Change notes' }).textContent).toContain('Version 3: “Indoor use only.”');
    expect(screen.queryAllByRole('radio')).toEqual([]);
  });

  test('when another older side is chosen in the sentence, then that comparison is fetched with the notes it spans', async () => {
    renderHistory();
    const form = await screen.findByRole('form', { name: 'Versions to compare' });

    await userEvent.selectOptions(within(form).getByRole('combobox', { name: 'since' }), 'version 1');

    expect(await screen.findByText('2 fields differ between version 1 and version 3.')).toBeTruthy();
    expect(diffs.at(-1)).toBe('1-3');
    expect(within(screen.getByRole('list', { name: 'Change notes' })).getAllByRole('listitem').map((li) => li.textContent)).toEqual([
      'Version 2: “Rejection margin raised to 6 dB after the bench run.”',
      'Version 3: “Indoor use only.”',
    ]);
  });

  test('when both compared versions have a ranking, then a link sets the two rankings side by side; when one has none, that is said', async () => {
    renderHistory();
    expect(await screen.findByText('1 field differs between version 2 and version 3.')).toBeTruthy();
    expect((await screen.findByText(/^Version 2 has no ranking/)).textContent).toContain('cannot be set side by side yet');

    await userEvent.selectOptions(within(screen.getByRole('form', { name: 'Versions to compare' })).getByRole('combobox', { name: 'since' }), 'version 1');

    const link = await screen.findByRole('link', { name: 'Set the rankings of versions 1 and 3 side by side (proposals #90 and #92)' });
    // The older version's ranking on side A, the same spec's (not the other spec's #93).
    expect(link.getAttribute('href')).toBe('/compare?a=90&b=92');
  });

  test('when a version’s own changes are asked for, then it is compared with the version before it', async () => {
    renderHistory();
    await userEvent.click(await screen.findByRole('button', { name: 'What version 2 changed' }));

    expect(await screen.findByText('1 field differs between version 1 and version 2.')).toBeTruthy();
    expect(diffs.at(-1)).toBe('1-2');
  });
});
