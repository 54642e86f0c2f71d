// @vitest-environment jsdom
/**
 * The API tokens section of the profile page: a token is made with a name, shown once with a copy
 * button, and gone from the page's list (which shows only its first characters); revoking sends
 * the token's id; the server's refusals are shown.
 */
import { configure, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, test, vi } from 'vitest';
import type { ApiToken } from '#shared/api/users';
import { ApiTokensSection } from '../../../web/src/features/profile/components/api-tokens-section';
import { useMockedApi } from '../helpers/fetch-stub';
import { renderWithClient } from '../helpers/render';

configure({ asyncUtilTimeout: 5000 });

const api = useMockedApi();

const SECRET = 'ltk_Q2lMb29tLXJpZy10b2tlbi1mb3ItdGVzdHMtMDAwMDAwMA';
const older: ApiToken = { id: 3, name: 'Nightly ranking', start: 'ltk_8fTq2a', createdAt: '2026-11-02T08:00:00.000Z', lastUsedAt: '2026-12-01T03:10:00.000Z', revokedAt: null };
const made: ApiToken = { id: 4, name: 'CI on the bench rig', start: SECRET.slice(0, 10), createdAt: '2026-12-05T09:00:00.000Z', lastUsedAt: null, revokedAt: null };

describe('the API tokens on your profile', () => {
  test('when a token is made, then it is shown once with a copy button that copies it, and the list shows only its start', async () => {
    const writeText = vi.fn(async () => {});
    const user = userEvent.setup();
    Object.defineProperty(navigator, 'clipboard', { value: { writeText }, configurable: true });
    api.routes['GET /api/auth/tokens'] = { status: 200, body: { items: [older] } };
    api.routes['POST /api/auth/tokens'] = { status: 201, body: { ...made, token: SECRET } };
    renderWithClient(<ApiTokensSection />);
    expect(await screen.findByText('Nightly ranking')).toBeTruthy();

    api.routes['GET /api/auth/tokens'] = { status: 200, body: { items: [made, older] } };
    await user.type(screen.getByLabelText('What it is for'), '  CI on the bench rig ');
    await user.click(screen.getByRole('button', { name: 'Make token' }));
    const shown = await screen.findByRole('status');
    await user.click(within(shown).getByRole('button', { name: 'Copy' }));

    expect(api.sent.find((r) => r.method === 'POST')?.body).toEqual({ name: 'CI on the bench rig' });
    expect(within(shown).getByLabelText('New token').textContent).toBe(SECRET);
    expect(writeText).toHaveBeenCalledWith(SECRET);
    expect(within(shown).getByRole('button', { name: 'Copied' })).toBeTruthy();
    const list = await screen.findByRole('list', { name: 'Your API tokens' });
    expect(await within(list).findByText('CI on the bench rig')).toBeTruthy();
    expect(list.textContent).not.toContain(SECRET);
    expect(list.textContent).toContain(`${SECRET.slice(0, 10)}…`);
    expect((screen.getByLabelText('What it is for') as HTMLInputElement).value).toBe('');
  });

  test('when a token is revoked, then its id is sent and the list shows it revoked without a button', async () => {
    api.routes['GET /api/auth/tokens'] = { status: 200, body: { items: [older] } };
    api.routes['DELETE /api/auth/tokens/3'] = { status: 200, body: { ...older, revokedAt: '2026-12-05T10:00:00.000Z' } };
    renderWithClient(<ApiTokensSection />);
    const revoke = await screen.findByRole('button', { name: 'Revoke Nightly ranking' });

    api.routes['GET /api/auth/tokens'] = { status: 200, body: { items: [{ ...older, revokedAt: '2026-12-05T10:00:00.000Z' }] } };
    await userEvent.click(revoke);

    expect(await screen.findByText(/revoked/)).toBeTruthy();
    expect(api.sent.filter((r) => r.method === 'DELETE').map((r) => r.path)).toEqual(['/api/auth/tokens/3']);
    expect(screen.queryByRole('button', { name: /Revoke/ })).toBeNull();
  });

  test('when the server refuses (too many tokens this hour), then its sentence is shown and no token appears', async () => {
    api.routes['GET /api/auth/tokens'] = { status: 200, body: { items: [] } };
    api.routes['POST /api/auth/tokens'] = { status: 429, body: { error: 'You made 10 API tokens in the last hour, the most one person may. Try again in 12 min.', code: 'too-many-tokens', details: [] } };
    renderWithClient(<ApiTokensSection />);
    expect(await screen.findByText('No tokens yet.')).toBeTruthy();

    await userEvent.type(screen.getByLabelText('What it is for'), 'One too many');
    await userEvent.click(screen.getByRole('button', { name: 'Make token' }));

    expect((await screen.findByRole('alert')).textContent).toContain('Try again in 12 min.');
    expect(screen.queryByLabelText('New token')).toBeNull();
    expect((screen.getByLabelText('What it is for') as HTMLInputElement).value).toBe('One too many');
  });
});
