// @vitest-environment jsdom
import { configure, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { beforeEach, describe, expect, test } from 'vitest';
import { ProjectMembers } from '../../../web/src/features/projects/components/project-members';
import type { ProjectMember } from '#shared/api/projects';
import type { User } from '#shared/api/users';
import type { ProjectRole } from '#shared/workflow/roles';
import { json, useFetchStub } from '../helpers/fetch-stub';
import { renderWithClient } from '../helpers/render';

configure({ asyncUtilTimeout: 5000 });

const person = (id: number, displayName: string): User => ({ id, email: `${id}@example.test`, displayName, role: 'member', createdAt: '2026-01-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null });
const PRIYA = person(3, 'Priya Valcourt');
const SAMIR = person(4, 'Samir Edelstein');

let members: ProjectMember[] = [];

/** A tiny member store behind the project's member endpoints. */
beforeEach(() => {
  members = [{ ...PRIYA, projectRole: 'designer' }];
});

const api = useFetchStub(({ key }, init) => {
  if (key === 'GET /api/auth/csrf') return json(200, { token: 't' });
  if (key === 'GET /api/projects/1/members') return json(200, { items: members });
  if (key === 'POST /api/projects/1/members') {
    const { userId, role } = JSON.parse(String(init?.body)) as { userId: number; role: ProjectRole };
    const account = [PRIYA, SAMIR].find((u) => u.id === userId)!;
    members = [...members.filter((m) => m.id !== userId), { ...account, projectRole: role }].sort((a, b) => a.id - b.id);
    return json(201, { id: 1, projectId: 1, userId, role });
  }
  if (key === 'DELETE /api/projects/1/members/3') {
    members = members.filter((m) => m.id !== 3);
    return new Response(null, { status: 204 });
  }
  return undefined;
});
const sentKeys = () => api.sent.map((r) => r.key);

function renderMembers(manage?: { allUsers: User[] }) {
  renderWithClient(<ProjectMembers projectId={1} manage={manage} />);
}

describe('people on a project', () => {
  test('when anyone but an admin looks, then members show with role titles and nothing to change', async () => {
    renderMembers();
    expect(await screen.findByText('Priya Valcourt')).toBeTruthy();
    expect(screen.getByText('Circuit designer')).toBeTruthy();
    expect(screen.queryByRole('button', { name: /Remove/ })).toBeNull();
    expect(screen.queryByLabelText('Add a person')).toBeNull();
  });

  test('when an admin adds someone, then only non-members are offered, the role in this project is sent, and the list is fetched again', async () => {
    renderMembers({ allUsers: [PRIYA, SAMIR] });
    const select = await screen.findByLabelText('Add a person');
    expect(within(select).queryByRole('option', { name: /Priya/ })).toBeNull();
    await userEvent.selectOptions(select, String(SAMIR.id));
    await userEvent.selectOptions(screen.getByLabelText('Their role in this project'), 'reviewer');
    await userEvent.click(screen.getByRole('button', { name: 'Add' }));

    expect(await screen.findByText('Samir Edelstein')).toBeTruthy();
    expect(api.sent.find((r) => r.key === 'POST /api/projects/1/members')?.body).toEqual({ userId: SAMIR.id, role: 'reviewer' });
    expect((screen.getByLabelText('Role of Samir Edelstein in this project') as HTMLSelectElement).value).toBe('reviewer');
    expect(sentKeys().filter((k) => k === 'GET /api/projects/1/members')).toHaveLength(2);
  });

  test('when an admin changes a member’s role in this project, then the new role is sent for that membership and shown', async () => {
    renderMembers({ allUsers: [PRIYA, SAMIR] });
    await userEvent.selectOptions(await screen.findByLabelText('Role of Priya Valcourt in this project'), 'reviewer');

    await waitFor(() => expect((screen.getByLabelText('Role of Priya Valcourt in this project') as HTMLSelectElement).value).toBe('reviewer'));
    expect(api.sent.find((r) => r.key === 'POST /api/projects/1/members')?.body).toEqual({ userId: PRIYA.id, role: 'reviewer' });
  });

  test('when an admin removes someone, then it is confirmed first and the list is fetched again', async () => {
    renderMembers({ allUsers: [PRIYA, SAMIR] });
    await userEvent.click(await screen.findByRole('button', { name: 'Remove Priya Valcourt' }));
    expect(sentKeys()).not.toContain('DELETE /api/projects/1/members/3');
    const confirm = screen.getByRole('group', { name: 'Confirm removing Priya Valcourt' });
    await userEvent.click(within(confirm).getByRole('button', { name: 'Remove' }));

    expect(await screen.findByText('Nobody is on this project yet.')).toBeTruthy();
    expect(sentKeys()).toContain('DELETE /api/projects/1/members/3');
  });
});
