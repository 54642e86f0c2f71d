// @vitest-environment jsdom
/**
 * The spec page's saving words: a change note goes with the save, and saving figures the latest
 * version already holds says that no new version was written (the server answers
 * `unchanged: true`). The server is a fetch stub with an invented spec.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, configure, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRoutesStub } from 'react-router-dom';
import { afterEach, describe, expect, test, vi } from 'vitest';
import specSchema from '#shared/schema/spec.schema.json';
import { authKeys } from '../../../web/src/lib/auth-queries';
import type { SpecVersion } from '#shared/api/specs';
import type { SessionUser } from '#shared/api/users';
import { Component, ErrorBoundary, loader } from '../../../web/src/routes/spec';
import { mockFetch, type MockAnswer } from './fetch-mock';

configure({ asyncUtilTimeout: 5000 });

const at = '2026-12-01T09:00:00.000Z';
const PAYLOAD = { title: 'Tarn probe', supply: { positiveV: 9, negativeV: -9 }, gain: { target: 20, tolerancePercent: 10, output: 'differential' }, cmrr: { minDb: 80, atFrequencyHz: 50, marginDb: 3, minYieldPercent: 95 } };
const LATEST: SpecVersion = { id: 72, specId: 7, version: 2, title: 'Tarn probe', payload: PAYLOAD as never, note: null, createdById: 5, createdAt: at };
const SPEC = { id: 7, projectId: 1, title: 'Tarn probe', latestVersion: 2, createdById: 5, createdAt: at, updatedAt: at, latest: LATEST };
const WRITER: SessionUser = { id: 5, email: 'r@example.test', displayName: 'Tomasz Rehn', role: 'member', projectRoles: [{ projectId: 1, role: 'requirements' }], createdAt: at, notify: true, noticesOff: [], disabledAt: null };

let network: ReturnType<typeof mockFetch> | undefined;
afterEach(() => {
  cleanup();
  network?.assertNoUnexpectedRequests();
  vi.unstubAllGlobals();
});

function renderSpecPage(saveAnswer: (body: unknown) => MockAnswer) {
  network = mockFetch({
    'GET /api/specs/7': { status: 200, body: SPEC },
    'GET /api/schema/spec': { status: 200, body: specSchema },
    'GET /api/projects/1': { status: 200, body: { id: 1, name: 'Tarn', description: '', createdById: 1, createdAt: at } },
    'GET /api/projects/1/members': { status: 200, body: { items: [WRITER] } },
    'GET /api/projects/1/devices?page=1&pageSize=100&state=library': { status: 200, body: { items: [], total: 0, page: 1, pageSize: 100 } },
    'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
    'PUT /api/specs/7': saveAnswer,
  });
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  queryClient.setQueryData(authKeys.me(), WRITER);
  const Stub = createRoutesStub([{ path: '/specs/:specId', Component, loader: loader(queryClient), ErrorBoundary, HydrateFallback: () => <p>Loading…</p> }]);
  render(
    <QueryClientProvider client={queryClient}>
      <Stub initialEntries={['/specs/7']} />
    </QueryClientProvider>,
  );
  return () => network!.requests.filter((r) => r.key === 'PUT /api/specs/7');
}

describe('spec page', () => {
  test('when the figures are saved unchanged, then the page says no new version was saved', async () => {
    const puts = renderSpecPage(() => ({ status: 200, body: { ...SPEC, unchanged: true } }));

    await userEvent.click(await screen.findByRole('button', { name: 'Save as new version' }));

    expect(await screen.findByText('Nothing differs from version 2, so no new version was saved.')).toBeTruthy();
    expect(puts()).toHaveLength(1);
    expect(screen.queryByText(/Saved as version/)).toBeNull();
  });

  test('when a change note is written, then it goes with the save, trimmed, and the field empties once a version is written', async () => {
    const puts = renderSpecPage(() => ({ status: 200, body: { ...SPEC, latestVersion: 3, latest: { ...LATEST, id: 73, version: 3, note: 'Indoor use only.' }, unchanged: false } }));

    const note = await screen.findByRole('textbox', { name: /Change note/ });
    await userEvent.type(note, '  Indoor use only.  ');
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));

    await waitFor(() => expect(puts()).toHaveLength(1));
    expect(puts()[0].body).toMatchObject({ title: 'Tarn probe', note: 'Indoor use only.' });
    await waitFor(() => expect((note as HTMLTextAreaElement).value).toBe(''));
  });
});
