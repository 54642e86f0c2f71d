// @vitest-environment jsdom
import { configure, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRoutesStub } from 'react-router-dom';
import { describe, expect, test } from 'vitest';
import { authKeys } from '../../../web/src/lib/auth-queries';
import { NewUserForm } from '../../../web/src/features/people/components/new-user-form';
import { UsersTable } from '../../../web/src/features/people/components/users-table';
import type { SessionUser, User } from '#shared/api/users';
import { Component as PeoplePage, loader } from '../../../web/src/routes/people';
import { useMockedApi } from '../helpers/fetch-stub';
import { renderWithClient, testQueryClient } from '../helpers/render';

configure({ asyncUtilTimeout: 5000 });

/** Mocked answers by "METHOD /path"; anything else is recorded and fails the test. */
const api = useMockedApi();

async function fillNewUser(fields: { email?: string; name?: string; password?: string } = {}) {
  await userEvent.type(screen.getByLabelText('E-mail'), fields.email ?? 'new.person@example.test');
  await userEvent.type(screen.getByLabelText('Display name'), fields.name ?? 'New Person');
  await userEvent.selectOptions(screen.getByLabelText('Account'), 'member');
  const password = fields.password ?? 'copper tail current';
  if (password) await userEvent.type(screen.getByLabelText('First password'), password);
  await userEvent.click(screen.getByRole('button', { name: 'Create account' }));
}

describe('new account form', () => {
  test('when the server refuses a field (400), then its detail shows by that field and the field takes focus', async () => {
    api.routes['POST /api/users'] = {
      status: 400,
      body: { error: 'The request is not valid.', code: 'invalid-request', details: [{ path: '/displayName', message: 'must NOT have more than 120 characters' }] },
    };
    renderWithClient(<NewUserForm />);
    await fillNewUser();

    const name = await screen.findByRole('textbox', { name: 'Display name', description: /Must NOT have more than 120 characters/ });
    expect(name.getAttribute('aria-invalid')).toBe('true');
    expect(document.activeElement).toBe(name);
    expect(screen.getByRole('textbox', { name: 'E-mail' }).getAttribute('aria-invalid')).toBeNull();
    const post = api.sent.find((r) => r.method === 'POST');
    expect(post?.body).toEqual({ email: 'new.person@example.test', displayName: 'New Person', role: 'member', password: 'copper tail current' });
    expect(post?.headers['X-CSRF-Token']).toBe('csrf-token');
  });

  test('when the e-mail is taken (409), then the server’s sentence shows by the e-mail field', async () => {
    api.routes['POST /api/users'] = {
      status: 409,
      body: { error: 'An account with this e-mail address exists already.', code: 'email-taken', details: [{ path: '/email', message: 'is taken' }] },
    };
    renderWithClient(<NewUserForm />);
    await fillNewUser({ email: 'designer@demo.longtail.test' });

    const email = await screen.findByRole('textbox', { name: 'E-mail', description: /An account with this e-mail address exists already/ });
    expect(email.getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByRole('textbox', { name: 'Display name' }).getAttribute('aria-invalid')).toBeNull();
  });

  test('when the password is shorter than 12 characters, then nothing is sent and the field says how many are missing', async () => {
    renderWithClient(<NewUserForm />);
    await userEvent.type(screen.getByLabelText('First password'), 'short');
    expect(screen.getByText('Too short: 7 more characters needed')).toBeTruthy();
    await fillNewUser({ password: '' });

    expect(await screen.findByText('Must be at least 12 characters')).toBeTruthy();
    expect(api.sent.filter((r) => r.method === 'POST')).toEqual([]);
  });

  test('when the account is created, then the form empties and says who can sign in', async () => {
    const created: User = { id: 9, email: 'new.person@example.test', displayName: 'New Person', role: 'member', createdAt: '2026-12-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null };
    api.routes['POST /api/users'] = { status: 201, body: created };
    renderWithClient(<NewUserForm />);
    await fillNewUser();

    expect(await screen.findByText(/New Person \(Member\) can now sign in as new.person@example.test/)).toBeTruthy();
    expect((screen.getByLabelText('E-mail') as HTMLInputElement).value).toBe('');
  });
});

describe('accounts table', () => {
  const me: User = { id: 1, email: 'admin@example.test', displayName: 'Ines Admin', role: 'admin', createdAt: '2026-01-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null };

  test('when you confirm taking the admin role from yourself, then the server’s refusal (409) is shown', async () => {
    api.routes['PATCH /api/users/1'] = { status: 409, body: { error: 'You cannot take the administrator role from yourself.', code: 'last-admin', details: [] } };
    renderWithClient(<UsersTable users={[me]} currentUserId={1} />);
    await userEvent.selectOptions(screen.getByLabelText('Role of Ines Admin'), 'member');
    const confirm = screen.getByRole('group', { name: 'Confirm the role change of Ines Admin' });
    expect(within(confirm).getByText(/Change your own role from/)).toBeTruthy();
    await userEvent.click(within(confirm).getByRole('button', { name: 'Change role' }));

    expect((await screen.findByRole('alert')).textContent).toMatch('You cannot take the administrator role from yourself.');
    expect((screen.getByLabelText('Role of Ines Admin') as HTMLSelectElement).value).toBe('admin');
    expect(api.sent.find((r) => r.method === 'PATCH')?.body).toEqual({ role: 'member' });
  });
});

describe('people page', () => {
  test('when someone other than an admin opens it, then it says so and asks the server for nothing', async () => {
    const queryClient = testQueryClient();
    queryClient.setQueryData(authKeys.me(), { id: 3, email: 'd@example.test', displayName: 'Dee', role: 'member', projectRoles: [{ projectId: 1, role: 'designer' }], createdAt: '2026-01-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null } satisfies SessionUser);
    const Stub = createRoutesStub([{ path: '/people', Component: PeoplePage, loader: loader(queryClient), HydrateFallback: () => null }]);
    renderWithClient(<Stub initialEntries={['/people']} />, queryClient);

    expect(await screen.findByRole('heading', { name: 'Not allowed' })).toBeTruthy();
    expect(api.sent).toEqual([]);
  });
});
