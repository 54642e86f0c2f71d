// @vitest-environment jsdom
/**
 * The admin Mail page (messages the local mail server received: list, click one to read it) and
 * the profile's e-mail switch (PATCH /api/auth/me with the CSRF token, the box following the
 * server's answer). fetch is mocked per test; the answers are invented.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { configure, render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ReactNode } from 'react';
import { createRoutesStub } from 'react-router-dom';
import { beforeEach, describe, expect, test } from 'vitest';
import { authKeys } from '../../../web/src/lib/auth-queries';
import type { Mailbox } from '#shared/api/admin';
import type { SessionUser, User } from '#shared/api/users';
import { Component as MailPage, loader as mailLoader } from '../../../web/src/routes/mail';
import { Component as ProfilePage, loader as profileLoader } from '../../../web/src/routes/profile';
import { useMockedApi } from '../helpers/fetch-stub';

configure({ asyncUtilTimeout: 5000 });

const api = useMockedApi();

const ADMIN: User = { id: 1, email: 'admin@example.test', displayName: 'Ines Admin', role: 'admin', notify: true, noticesOff: [], createdAt: '2026-01-01T00:00:00Z', disabledAt: null };
const DESIGNER: SessionUser = { id: 3, email: 'priya@example.test', displayName: 'Priya Example', role: 'member', projectRoles: [{ projectId: 1, role: 'designer' }], notify: true, noticesOff: [], createdAt: '2026-01-01T00:00:00Z', disabledAt: null };

const MAILBOX: Mailbox = {
  items: [
    {
      id: 2,
      at: '2026-12-01T10:05:00.000Z',
      from: 'longtail@localhost',
      to: ['reviewer@example.test'],
      subject: 'Proposal #7 decided, waiting for review',
      text: 'Hello Sam,\n\nPriya decided proposal #7.\n\nFigures are estimates; confirm them by simulation and bench measurement.',
      outboxId: 12,
    },
    {
      id: 1,
      at: '2026-12-01T10:00:00.000Z',
      from: 'longtail@localhost',
      to: ['priya@example.test'],
      subject: 'Proposal #7 waits for a decision',
      text: 'Hello Priya,\n\nProposal #7 waits for your decision.',
      outboxId: 11,
    },
  ],
  total: 2,
  outbox: { pending: 1, sent: 2, failed: 0 },
};

function renderRoute(path: string, Component: React.ComponentType, loader: (qc: QueryClient) => () => Promise<null>, me: User, extra?: ReactNode) {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  queryClient.setQueryData(authKeys.me(), me);
  const Stub = createRoutesStub([{ path, Component, loader: loader(queryClient), HydrateFallback: () => null }]);
  render(
    <QueryClientProvider client={queryClient}>
      <Stub initialEntries={[path]} />
      {extra}
    </QueryClientProvider>,
  );
  return queryClient;
}

describe('mail page', () => {
  test('when an admin opens it, then the newest message is open and clicking another shows its text', async () => {
    api.routes['GET /api/admin/mail'] = { status: 200, body: MAILBOX };
    renderRoute('/admin/mail', MailPage, mailLoader, ADMIN);

    const reading = await screen.findByRole('region', { name: 'Message' });
    expect(within(reading).getByRole('heading', { name: 'Proposal #7 decided, waiting for review' })).toBeTruthy();
    expect(reading.textContent).toContain('reviewer@example.test');
    expect(screen.getByText('Outbox: 1 waiting to be sent.')).toBeTruthy();

    await userEvent.click(screen.getByRole('button', { name: /Proposal #7 waits for a decision/ }));

    expect(within(reading).getByRole('heading', { name: 'Proposal #7 waits for a decision' })).toBeTruthy();
    expect(reading.textContent).toContain('Proposal #7 waits for your decision.');
    expect(screen.getByRole('button', { name: /Proposal #7 waits for a decision/ }).getAttribute('aria-current')).toBe('true');
  });

  test('when someone other than an admin opens it, then it says so and asks the server for nothing', async () => {
    renderRoute('/admin/mail', MailPage, mailLoader, DESIGNER);

    expect(await screen.findByRole('heading', { name: 'Not allowed' })).toBeTruthy();
    expect(api.sent).toEqual([]);
  });
});

describe('profile page', () => {
  // the page's API-token section reads the person's tokens (none here)
  beforeEach(() => {
    api.routes['GET /api/auth/tokens'] = { status: 200, body: { items: [] } };
  });

  test('when the designer unticks the e-mail box, then PATCH /api/auth/me carries notify false with the CSRF token and the box stays off', async () => {
    api.routes['PATCH /api/auth/me'] = { status: 200, body: { user: { ...DESIGNER, notify: false } } };
    api.routes['GET /api/auth/me'] = { status: 200, body: { user: { ...DESIGNER, notify: false } } };
    renderRoute('/profile', ProfilePage, profileLoader, DESIGNER);
    const box = (await screen.findByRole('checkbox', { name: /E-mail me about the workflow/ })) as HTMLInputElement;
    expect(box.checked).toBe(true);

    await userEvent.click(box);

    expect(await screen.findByText('Saved: e-mail is off.')).toBeTruthy();
    expect(box.checked).toBe(false);
    const patch = api.sent.find((r) => r.method === 'PATCH');
    expect(patch).toMatchObject({ path: '/api/auth/me', body: { notify: false } });
    expect(patch?.headers['X-CSRF-Token']).toBe('csrf-token');
  });

  test('when the server refuses the change, then its words show and the box keeps the stored setting', async () => {
    api.routes['PATCH /api/auth/me'] = { status: 500, body: { error: 'The database is busy; try again.', code: 'internal', details: [] } };
    renderRoute('/profile', ProfilePage, profileLoader, DESIGNER);
    const box = (await screen.findByRole('checkbox', { name: /E-mail me about the workflow/ })) as HTMLInputElement;

    await userEvent.click(box);

    expect((await screen.findByRole('alert')).textContent).toContain('The database is busy; try again.');
    expect(box.checked).toBe(true);
  });
});
