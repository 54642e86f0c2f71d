// @vitest-environment jsdom
/**
 * The profile's switches per kind of e-mail notice: one switch for each kind the feature names
 * (ready for decision, decided, signed off, sent back, closed as superseded, a new version of a
 * spec you ranked, your SPICE check done), each with its description; a click saves the whole list
 * of kinds turned off through PATCH /api/auth/me with the CSRF token; the master switch off makes
 * them unusable; a refused save leaves the stored setting. fetch is mocked; the answers are invented.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { configure, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRoutesStub } from 'react-router-dom';
import { beforeEach, describe, expect, test } from 'vitest';
import { authKeys } from '../../../web/src/lib/auth-queries';
import type { SessionUser } from '#shared/api/users';
import { Component as ProfilePage, loader as profileLoader } from '../../../web/src/routes/profile';
import { useMockedApi } from '../helpers/fetch-stub';

configure({ asyncUtilTimeout: 5000 });

const api = useMockedApi();

const DESIGNER: SessionUser = { id: 3, email: 'oriel@example.test', displayName: 'Oriel Banfield', role: 'member', projectRoles: [{ projectId: 1, role: 'designer' }], notify: true, noticesOff: [], createdAt: '2026-01-01T00:00:00Z', disabledAt: null };

/** The kinds as the feature's brief words them: what each switch must be about. */
const KINDS_IN_WORDS = [/waits for a decision/i, /waits for review/i, /signed off/i, /sent back/i, /spec moved on/i, /comment on your decision/i, /new version of a spec you ranked/i, /SPICE check/i];

function renderProfile(me: SessionUser) {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  queryClient.setQueryData(authKeys.me(), me);
  const Stub = createRoutesStub([{ path: '/profile', Component: ProfilePage, loader: profileLoader(queryClient), HydrateFallback: () => null }]);
  render(
    <QueryClientProvider client={queryClient}>
      <Stub initialEntries={['/profile']} />
    </QueryClientProvider>,
  );
}

/** Answers the PATCH with the person as changed, and the next GET /me the same. */
function serverKeeps(user: SessionUser) {
  api.routes['PATCH /api/auth/me'] = { status: 200, body: { user } };
  api.routes['GET /api/auth/me'] = { status: 200, body: { user } };
}

const switchNamed = (name: RegExp) => screen.findByRole('switch', { name }) as Promise<HTMLInputElement>;

describe('the switches per kind of e-mail', () => {
  beforeEach(() => {
    api.routes['GET /api/auth/tokens'] = { status: 200, body: { items: [] } };
  });

  test('when the page opens, then there is one switch per kind, each described in words, on unless stored off', async () => {
    renderProfile({ ...DESIGNER, noticesOff: ['proposal.superseded'] });
    await screen.findByRole('checkbox', { name: /E-mail me about the workflow/ });
    const switches = screen.getAllByRole('switch') as HTMLInputElement[];
    expect(switches).toHaveLength(KINDS_IN_WORDS.length);
    for (const words of KINDS_IN_WORDS) expect(switches.filter((s) => words.test(s.labels?.[0]?.textContent ?? '')), String(words)).toHaveLength(1);
    // Each has a description of its own beside the title
    for (const s of switches) expect(s.getAttribute('aria-describedby') && document.getElementById(s.getAttribute('aria-describedby')!)?.textContent?.length).toBeGreaterThan(20);
    expect((await switchNamed(/spec moved on/i)).checked).toBe(false);
    expect(switches.filter((s) => s.checked)).toHaveLength(KINDS_IN_WORDS.length - 1);
  });

  test('when the designer turns "new version" off, then the list of kinds off is sent with the CSRF token, and it stays off', async () => {
    serverKeeps({ ...DESIGNER, noticesOff: ['proposal.superseded', 'spec.new-version'] });
    renderProfile({ ...DESIGNER, noticesOff: ['proposal.superseded'] });
    const box = await switchNamed(/new version of a spec you ranked/i);
    expect(box.checked).toBe(true);

    await userEvent.click(box);

    expect(await screen.findByText(/Saved: .*new version of a spec you ranked.* off\./i)).toBeTruthy();
    expect(box.checked).toBe(false);
    const patch = api.sent.find((r) => r.method === 'PATCH');
    expect(patch).toMatchObject({ path: '/api/auth/me', body: { noticesOff: ['proposal.superseded', 'spec.new-version'] } });
    expect(patch?.headers['X-CSRF-Token']).toBe('csrf-token');
    // The master switch is left alone
    expect(patch?.body).not.toHaveProperty('notify');
  });

  test('when a kind that was off is turned on, then the list sent leaves it out', async () => {
    serverKeeps({ ...DESIGNER, noticesOff: ['proposal.decided'] });
    renderProfile({ ...DESIGNER, noticesOff: ['verification.ended', 'proposal.decided'] });
    const box = await switchNamed(/SPICE check/i);
    expect(box.checked).toBe(false);

    await userEvent.click(box);

    expect(await screen.findByText(/Saved: .*SPICE check.* on\./i)).toBeTruthy();
    expect(box.checked).toBe(true);
    expect(api.sent.find((r) => r.method === 'PATCH')?.body).toEqual({ noticesOff: ['proposal.decided'] });
  });

  test('when e-mail is off, then the switches per kind cannot be used and say why', async () => {
    renderProfile({ ...DESIGNER, notify: false, noticesOff: ['proposal.ready'] });
    await screen.findByRole('checkbox', { name: /E-mail me about the workflow/ });
    for (const s of screen.getAllByRole('switch') as HTMLInputElement[]) expect(s.disabled).toBe(true);
    expect(screen.getByText(/E-mail is off, so none of these comes/)).toBeTruthy();
  });

  test('when the server refuses the change, then its words show and the switch keeps the stored setting', async () => {
    api.routes['PATCH /api/auth/me'] = { status: 400, body: { error: 'The request is not valid.', code: 'invalid-request', details: [{ path: '/noticesOff/0', message: 'must be one of the known kinds' }] } };
    renderProfile(DESIGNER);
    const box = await switchNamed(/signed off/i);

    await userEvent.click(box);

    expect((await screen.findByRole('alert')).textContent).toContain('not valid');
    expect(box.checked).toBe(true);
  });
});
