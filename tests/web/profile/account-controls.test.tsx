// @vitest-environment jsdom
/**
 * The account controls in the browser: your own password change on the profile page, the page a
 * one-time link opens, and an administrator's password link and disable/enable on the people page.
 */
import { configure, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRoutesStub } from 'react-router-dom';
import { describe, expect, test } from 'vitest';
import { UsersTable } from '../../../web/src/features/people/components/users-table';
import { PasswordChangeForm } from '../../../web/src/features/profile/components/password-change-form';
import type { User } from '#shared/api/users';
import { Component as PasswordResetPage } from '../../../web/src/routes/password-reset';
import { useMockedApi } from '../helpers/fetch-stub';
import { renderWithClient } from '../helpers/render';

configure({ asyncUtilTimeout: 5000 });

const api = useMockedApi();

async function fillPasswords(current: string | null, next: string, again = next) {
  if (current !== null) await userEvent.type(screen.getByLabelText('Current password'), current);
  await userEvent.type(screen.getByLabelText('New password'), next);
  await userEvent.type(screen.getByLabelText('New password again'), again);
}

describe('your own password', () => {
  test('when the current password is wrong (400 at /currentPassword), then the message shows by that field', async () => {
    api.routes['POST /api/auth/password'] = { status: 400, body: { error: 'The current password is not right.', code: 'invalid-request', details: [{ path: '/currentPassword', message: 'is not your current password' }] } };
    renderWithClient(<PasswordChangeForm />);
    await fillPasswords('guessing-wrong-1', 'heron-slate-2291-weir');
    await userEvent.click(screen.getByRole('button', { name: 'Change password' }));

    const field = await screen.findByLabelText('Current password', { selector: 'input[aria-invalid="true"]' });
    expect(field.getAttribute('aria-describedby')).toBeTruthy();
    expect(screen.getByText('Is not your current password')).toBeTruthy();
    expect(api.sent.find((r) => r.method === 'POST')?.body).toEqual({ currentPassword: 'guessing-wrong-1', newPassword: 'heron-slate-2291-weir' });
  });

  test('when the two new passwords differ, then nothing is sent', async () => {
    renderWithClient(<PasswordChangeForm />);
    await fillPasswords('my-current-pass-1', 'heron-slate-2291-weir', 'heron-slate-2291-wier');
    await userEvent.click(screen.getByRole('button', { name: 'Change password' }));

    expect(await screen.findByText('Does not match the new password')).toBeTruthy();
    expect(api.sent.filter((r) => r.method === 'POST')).toEqual([]);
  });

  test('when the change is saved, then the form empties and says how many other sessions were signed out', async () => {
    api.routes['POST /api/auth/password'] = { status: 200, body: { endedSessions: 2 } };
    renderWithClient(<PasswordChangeForm />);
    await fillPasswords('my-current-pass-1', 'heron-slate-2291-weir');
    await userEvent.click(screen.getByRole('button', { name: 'Change password' }));

    expect((await screen.findByRole('status')).textContent).toMatch('Password changed. 2 other sessions were signed out.');
    expect((screen.getByLabelText('Current password') as HTMLInputElement).value).toBe('');
  });
});

describe('the page a password link opens', () => {
  const renderAt = (entry: string) => {
    const Stub = createRoutesStub([{ path: '/password-reset', Component: PasswordResetPage }, { path: '/sign-in', Component: () => <p>Sign-in page</p> }]);
    renderWithClient(<Stub initialEntries={[entry]} />);
  };

  test('when the new password is set, then the token from the link’s # part is sent with it and the page says what happened', async () => {
    api.routes['POST /api/auth/password-reset'] = { status: 200, body: { email: 'quill@example.test' } };
    renderAt('/password-reset#Tk3n_from-the-mail-0123456789');
    await fillPasswords(null, 'heron-slate-2291-weir');
    await userEvent.click(screen.getByRole('button', { name: 'Set the new password' }));

    expect((await screen.findByRole('status')).textContent).toMatch('The password of quill@example.test is set.');
    expect(api.sent.find((r) => r.method === 'POST')?.body).toEqual({ token: 'Tk3n_from-the-mail-0123456789', newPassword: 'heron-slate-2291-weir' });
    expect(screen.getByRole('link', { name: 'Sign in with the new password' })).toBeTruthy();
  });

  test('when the link is used up or expired, then the server’s sentence is shown', async () => {
    api.routes['POST /api/auth/password-reset'] = {
      status: 400,
      body: { error: 'This password link is not valid any more (used, replaced by a newer one, or expired): ask an administrator for a new one.', code: 'reset-link-invalid', details: [{ path: '/token', message: 'is not an open reset link' }] },
    };
    renderAt('/password-reset#Tk3n_from-the-mail-0123456789');
    await fillPasswords(null, 'heron-slate-2291-weir');
    await userEvent.click(screen.getByRole('button', { name: 'Set the new password' }));

    expect((await screen.findByRole('alert')).textContent).toMatch('This password link is not valid any more');
  });

  test('when the page is opened without the # part, then it asks for the whole link and offers no form', () => {
    renderAt('/password-reset');

    expect(screen.getByRole('alert').textContent).toMatch('needs the whole link');
    expect(screen.queryByRole('button', { name: 'Set the new password' })).toBeNull();
  });
});

describe('account controls on the people page', () => {
  const me: User = { id: 1, email: 'admin@example.test', displayName: 'Ines Admin', role: 'admin', createdAt: '2026-01-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null };
  const dee: User = { id: 3, email: 'dee@example.test', displayName: 'Dee Ormond', role: 'member', createdAt: '2026-01-02T00:00:00Z', notify: true, noticesOff: [], disabledAt: null };

  test('when Disable is confirmed, then PATCH { disabled: true } is sent; your own row offers no Disable', async () => {
    api.routes['PATCH /api/users/3'] = { status: 200, body: { ...dee, disabledAt: '2026-03-02T09:00:00Z' } };
    api.routes['GET /api/users'] = { status: 200, body: { items: [me, { ...dee, disabledAt: '2026-03-02T09:00:00Z' }] } };
    renderWithClient(<UsersTable users={[me, dee]} currentUserId={1} />);

    expect(screen.queryByRole('button', { name: 'Disable Ines Admin' })).toBeNull();
    await userEvent.click(screen.getByRole('button', { name: 'Disable Dee Ormond' }));
    const confirm = screen.getByRole('group', { name: 'Confirm disabling Dee Ormond' });
    expect(within(confirm).getByText(/signed out at once/)).toBeTruthy();
    await userEvent.click(within(confirm).getByRole('button', { name: 'Disable account' }));

    await screen.findByRole('button', { name: 'Disable Dee Ormond' });
    expect(api.sent.find((r) => r.method === 'PATCH')?.body).toEqual({ disabled: true });
  });

  test('when a disabled account is listed, then it is marked and offers Enable', async () => {
    api.routes['PATCH /api/users/3'] = { status: 200, body: dee };
    api.routes['GET /api/users'] = { status: 200, body: { items: [me, dee] } };
    renderWithClient(<UsersTable users={[me, { ...dee, disabledAt: '2026-03-02T09:00:00Z' }]} currentUserId={1} />);

    expect(screen.getByText('Disabled')).toBeTruthy();
    await userEvent.click(screen.getByRole('button', { name: 'Enable Dee Ormond' }));

    await screen.findByRole('button', { name: 'Enable Dee Ormond' });
    expect(api.sent.find((r) => r.method === 'PATCH')?.body).toEqual({ disabled: false });
  });

  test('when a password link is sent, then the row says where it went and until when it works', async () => {
    api.routes['POST /api/users/3/password-reset'] = { status: 202, body: { expiresAt: '2026-03-03T09:00:00Z' } };
    renderWithClient(<UsersTable users={[me, dee]} currentUserId={1} />);

    await userEvent.click(screen.getByRole('button', { name: 'Mail Dee Ormond a password link' }));

    const status = await screen.findByRole('status');
    expect(status.textContent).toMatch('on its way to dee@example.test');
    expect(status.querySelector('time')?.getAttribute('dateTime')).toBe('2026-03-03T09:00:00Z');
  });
});
