// @vitest-environment jsdom
/**
 * Comments on the proposal page: the mark beside a check row counts its open threads, opens the
 * thread panel (focus on its heading, Escape gives it back), shows comment text as text, and sends
 * a reply, a resolve and a new thread with the anchor; a systems engineer reads without forms.
 */
import { cleanup, fireEvent, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, test, vi } from 'vitest';
import type { CommentThread } from '#shared/api/comments';
import type { SessionUser } from '#shared/api/users';
import { ChecksTable } from '../../../../web/src/features/proposals/components/ranking/checks-table';
import { CommentsProvider } from '../../../../web/src/features/proposals/components/comments/comments-context';
import { CommentsSheet } from '../../../../web/src/features/proposals/components/comments/comments-sheet';
import { mockFetch } from '../decision/fixtures/fetch-mock';
import { DESIGNER, proposalFixture, RANKING, REVIEWER } from '../decision/fixtures/proposal-fixture';
import { renderWithClient } from '../../helpers/render';

let fetchMock: ReturnType<typeof mockFetch>;

afterEach(() => {
  cleanup();
  expect(fetchMock.unmocked).toEqual([]);
  vi.unstubAllGlobals();
});

const option = RANKING.options[0]!;
const [firstCheck, secondCheck] = option.checks;
const REQUIREMENTS: SessionUser = { ...REVIEWER, id: 5, displayName: 'Ines Marchetti', projectRoles: [{ projectId: 1, role: 'requirements' }] };

function thread(overrides: Partial<CommentThread> = {}): CommentThread {
  return {
    id: 7,
    proposalId: 2,
    anchor: { kind: 'check', topology: option.topology, checkId: firstCheck!.rule },
    specVersionId: 1,
    specVersion: 1,
    engineVersion: RANKING.engineVersion,
    rulesetVersion: RANKING.rulesetVersion,
    body: 'Is <b>this</b> the cold corner?\nIt reads tight.',
    author: { id: REVIEWER.id, displayName: REVIEWER.displayName },
    createdAt: '2026-03-02T10:00:00.000Z',
    resolvedAt: null,
    resolvedBy: null,
    replies: [],
    ...overrides,
  };
}

function renderPage(user: SessionUser, threads: CommentThread[]) {
  const proposal = proposalFixture({ status: 'decided', allowedEvents: ['approve', 'return'] });
  fetchMock = mockFetch({
    'GET /api/proposals/2/comments': () => ({ body: { items: threads } }),
    'POST /api/proposals/2/comments/7/replies': (call) => ({ status: 201, body: thread({ replies: [{ id: 8, body: (call.body as { body: string }).body, author: { id: DESIGNER.id, displayName: DESIGNER.displayName }, createdAt: '2026-03-02T11:00:00.000Z' }] }) }),
    'PATCH /api/proposals/2/comments/7': () => ({ body: thread({ resolvedAt: '2026-03-02T12:00:00.000Z', resolvedBy: { id: DESIGNER.id, displayName: DESIGNER.displayName } }) }),
    'POST /api/proposals/2/comments': () => ({ status: 201, body: thread({ id: 9 }) }),
  });
  return renderWithClient(
    <CommentsProvider proposal={proposal} user={user}>
      <ChecksTable checks={option.checks} topology={option.topology} />
      <CommentsSheet />
    </CommentsProvider>,
  );
}

describe('comment threads on the proposal page', () => {
  test('when a check has an open thread, then its mark says so, and the panel shows the text as text with its state and record', async () => {
    renderPage(DESIGNER, [thread()]);

    const mark = await screen.findByRole('button', { name: new RegExp(`^Comments on the check .* of the .*: 1 open, 0 resolved$`) });
    expect(mark.textContent).toContain('1 open');
    expect(screen.getAllByRole('button', { name: /^Comment on the check/ })).toHaveLength(option.checks.length - 1);

    fireEvent.click(mark);
    const panel = screen.getByRole('dialog', { name: 'Comments' });
    expect(document.activeElement).toBe(within(panel).getByRole('heading', { name: 'Comments' }));
    const article = within(panel).getByRole('article', { name: `Comment #7 by ${REVIEWER.displayName}` });
    expect(article.textContent).toContain('Is <b>this</b> the cold corner?');
    expect(article.querySelector('b')).toBeNull();
    expect(article.textContent).toMatch(/Open/);
    expect(article.textContent).toContain('Written on spec version 1');

    fireEvent.keyDown(panel, { key: 'Escape' });
    expect(screen.queryByRole('dialog')).toBeNull();
    expect(document.activeElement).toBe(mark);
  });

  test('when the designer replies and resolves, then the reply and the resolve go to the thread', async () => {
    renderPage(DESIGNER, [thread()]);
    fireEvent.click(await screen.findByRole('button', { name: /: 1 open, 0 resolved$/ }));
    const panel = screen.getByRole('dialog', { name: 'Comments' });

    fireEvent.change(within(panel).getByLabelText('Reply'), { target: { value: '  Yes: 0 °C, supply low.  ' } });
    fireEvent.click(within(panel).getByRole('button', { name: 'Reply' }));
    await waitFor(() => expect(fetchMock.to('POST', '/api/proposals/2/comments/7/replies')).toHaveLength(1));
    expect(fetchMock.to('POST', '/api/proposals/2/comments/7/replies')[0]!.body).toEqual({ body: 'Yes: 0 °C, supply low.' });

    fireEvent.click(within(panel).getByRole('button', { name: 'Resolve' }));
    await waitFor(() => expect(fetchMock.to('PATCH', '/api/proposals/2/comments/7')).toHaveLength(1));
    expect(fetchMock.to('PATCH', '/api/proposals/2/comments/7')[0]!.body).toEqual({ resolved: true });
  });

  test('when a reviewer starts a thread on another check, then the anchor goes with the text', async () => {
    renderPage(REVIEWER, []);
    fireEvent.click(await screen.findByRole('button', { name: new RegExp(`^Comment on the check “${secondCheck!.title ?? secondCheck!.rule}”`) }));
    const panel = screen.getByRole('dialog', { name: 'Comments' });
    expect(within(panel).getByText('No comments here yet.')).toBeTruthy();

    fireEvent.change(within(panel).getByLabelText('New comment'), { target: { value: 'Which resistor sets this?' } });
    fireEvent.click(within(panel).getByRole('button', { name: 'Post comment' }));

    await waitFor(() => expect(fetchMock.to('POST', '/api/proposals/2/comments')).toHaveLength(1));
    expect(fetchMock.to('POST', '/api/proposals/2/comments')[0]!.body).toEqual({ anchorKind: 'check', topology: option.topology, checkId: secondCheck!.rule, body: 'Which resistor sets this?' });
  });

  test('when a systems engineer reads, then threads show without forms, and anchors without threads offer nothing', async () => {
    renderPage(REQUIREMENTS, [thread({ resolvedAt: '2026-03-02T12:00:00.000Z', resolvedBy: { id: DESIGNER.id, displayName: DESIGNER.displayName } })]);

    const mark = await screen.findByRole('button', { name: /: 0 open, 1 resolved$/ });
    expect(screen.queryAllByRole('button', { name: /^Comment on/ })).toHaveLength(0);
    const sheet = screen.getByRole('region', { name: 'Comments' });
    expect(sheet.textContent).toContain('0 open, 1 resolved.');
    expect(sheet.textContent).toContain(`Resolved by ${DESIGNER.displayName}`);

    fireEvent.click(mark);
    const panel = screen.getByRole('dialog', { name: 'Comments' });
    expect(within(panel).queryByRole('textbox')).toBeNull();
    expect(within(panel).queryByRole('button', { name: /Resolve|Reopen/ })).toBeNull();
    expect(panel.textContent).toContain('Designers and reviewers of this project can comment.');
  });
});
