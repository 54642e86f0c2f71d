// @vitest-environment jsdom
/**
 * The navigation's search box: `/` brings the cursor to it (not while typing in another field);
 * typing asks the search once and lists the hits grouped by kind with the matched words marked
 * (stored text shown as text, never as markup); the arrow keys choose, Enter opens the chosen hit
 * or the results page, Escape clears and then leaves; a person's hit leads where the viewer may go.
 */
import { QueryClientProvider } from '@tanstack/react-query';
import { configure, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRoutesStub, useLocation } from 'react-router-dom';
import { describe, expect, test } from 'vitest';
import type { SearchAnswer, SearchHit } from '#shared/api/search';
import type { SessionUser } from '#shared/api/users';
import { SearchBox } from '../../../web/src/components/search/search-box';
import { authKeys } from '../../../web/src/lib/auth-queries';
import { hitHref } from '../../../web/src/lib/search-queries';
import { json, useFetchStub } from '../helpers/fetch-stub';
import { testQueryClient } from '../helpers/render';

configure({ asyncUtilTimeout: 5000 });

const MEMBER: SessionUser = { id: 3, email: 'priya@example.test', displayName: 'Priya Valcourt', role: 'member', projectRoles: [{ projectId: 1, role: 'designer' }], createdAt: '2026-01-01T00:00:00Z', notify: true, noticesOff: [], disabledAt: null };
const ADMIN: SessionUser = { ...MEMBER, id: 1, role: 'admin', projectRoles: [] };

const hit = (fields: Partial<SearchHit> & Pick<SearchHit, 'kind' | 'id'>): SearchHit => ({ title: [{ text: 'Untitled', marked: false }], excerpt: null, project: { id: 1, name: 'Kestrel load-cell amplifier' }, state: null, ...fields });
const SPEC = hit({
  kind: 'spec',
  id: 7,
  title: [{ text: 'Kestrel rev B <img src=x onerror=alert(1)>', marked: false }],
  excerpt: [
    { text: 'Minimum CMRR: ', marked: false },
    { text: '80 dB', marked: true },
  ],
});
const PROPOSAL = hit({ kind: 'proposal', id: 31, title: [{ text: '#31 Kestrel rev B', marked: false }], excerpt: [{ text: 'Noise: ', marked: false }, { text: '80 dB', marked: true }], state: 'decided' });
const ANSWER: SearchAnswer = {
  words: ['80', 'db'],
  counts: { project: 0, spec: 1, proposal: 3, person: 0 },
  groups: [
    { kind: 'spec', items: [SPEC], total: 1, page: 1, pageSize: 3 },
    { kind: 'proposal', items: [PROPOSAL], total: 3, page: 1, pageSize: 3 },
  ],
};

const stub = useFetchStub((request) => {
  const url = new URL(request.path, 'http://longtail.test');
  if (url.pathname === '/api/search') return json(200, url.searchParams.get('q') === 'zzz' ? { words: ['zzz'], counts: { project: 0, spec: 0, proposal: 0, person: 0 }, groups: [] } : ANSWER);
  return undefined;
});

function Where() {
  const location = useLocation();
  return <output data-testid="where">{location.pathname + location.search}</output>;
}

function renderBox(user: SessionUser = MEMBER) {
  const queryClient = testQueryClient();
  queryClient.setQueryData(authKeys.me(), user);
  const page = () => (
    <>
      <SearchBox />
      <label>
        Reason <input />
      </label>
      <Where />
    </>
  );
  const Stub = createRoutesStub([{ path: '*', Component: page }]);
  render(
    <QueryClientProvider client={queryClient}>
      <Stub initialEntries={['/']} />
    </QueryClientProvider>,
  );
  return screen.getByRole('combobox', { name: 'Search projects, specs, proposals and people' });
}

const searches = () => stub.sent.map((r) => new URL(r.path, 'http://longtail.test')).filter((u) => u.pathname === '/api/search');

describe('the navigation’s search box', () => {
  test('when / is pressed outside a field, then the box takes the cursor; inside a field it is only a character', async () => {
    const box = renderBox();
    await userEvent.keyboard('/');
    expect(document.activeElement).toBe(box);
    expect((box as HTMLInputElement).value).toBe('');

    const reason = screen.getByRole('textbox', { name: 'Reason' });
    await userEvent.click(reason);
    await userEvent.keyboard('a/b');
    expect((reason as HTMLInputElement).value).toBe('a/b');
    expect(document.activeElement).toBe(reason);
  });

  test('when a query is typed, then the search is asked once it pauses and the hits are listed by kind, the matched words marked and stored text shown as text', async () => {
    const box = renderBox();
    await userEvent.click(box);
    await userEvent.keyboard('80 dB');

    const list = await screen.findByRole('listbox', { name: 'Search results' });
    expect(searches().map((u) => u.search)).toEqual(['?q=80+dB&page=1&pageSize=3']);
    expect(within(list).getByRole('group', { name: 'Specs: 1' })).toBeTruthy();
    expect(within(list).getByRole('group', { name: 'Proposals: 3' })).toBeTruthy();
    const spec = within(list).getAllByRole('option')[0];
    expect(spec.textContent).toContain('Kestrel rev B <img src=x onerror=alert(1)>');
    expect(spec.querySelector('img')).toBeNull();
    expect([...spec.querySelectorAll('mark')].map((m) => m.textContent)).toEqual(['80 dB']);
    expect(within(list).getByRole('option', { name: /All 4 results for “80 dB”/ })).toBeTruthy();
    expect(box.getAttribute('aria-expanded')).toBe('true');
  });

  test('when the arrow keys choose a hit and Enter is pressed, then its page opens', async () => {
    const box = renderBox();
    await userEvent.click(box);
    await userEvent.keyboard('80 dB');
    await screen.findByRole('listbox');
    await userEvent.keyboard('{ArrowDown}{ArrowDown}');
    const chosen = screen.getByRole('option', { selected: true });
    expect(box.getAttribute('aria-activedescendant')).toBe(chosen.id);
    expect(chosen.textContent).toContain('#31 Kestrel rev B');
    await userEvent.keyboard('{Enter}');
    await waitFor(() => expect(screen.getByTestId('where').textContent).toBe('/proposals/31'));
    expect(screen.queryByRole('listbox')).toBeNull();
  });

  test('when Enter is pressed with no hit chosen, then the results page opens for the query; Up from the box chooses the last option', async () => {
    const box = renderBox();
    await userEvent.click(box);
    await userEvent.keyboard('80 dB');
    await screen.findByRole('listbox');
    await userEvent.keyboard('{ArrowUp}');
    expect(screen.getByRole('option', { selected: true }).textContent).toMatch(/^All 4 results/);
    await userEvent.keyboard('{ArrowDown}{Enter}');
    // Down from the last option wraps to the first hit.
    await waitFor(() => expect(screen.getByTestId('where').textContent).toBe('/specs/7'));

    await userEvent.click(box);
    await userEvent.keyboard('80 dB{Enter}');
    await waitFor(() => expect(screen.getByTestId('where').textContent).toBe('/search?q=80+dB'));
  });

  test('when Escape is pressed, then the box is cleared and the list closed; pressed again, the cursor leaves the box', async () => {
    const box = renderBox();
    await userEvent.click(box);
    await userEvent.keyboard('80 dB');
    await screen.findByRole('listbox');
    await userEvent.keyboard('{Escape}');
    expect((box as HTMLInputElement).value).toBe('');
    expect(screen.queryByRole('listbox')).toBeNull();
    expect(document.activeElement).toBe(box);
    await userEvent.keyboard('{Escape}');
    expect(document.activeElement).not.toBe(box);
  });

  test('when nothing matches, then the box says so and offers no list', async () => {
    const box = renderBox();
    await userEvent.click(box);
    await userEvent.keyboard('zzz');
    // In the popup under the box (the live line beside it says the same to assistive technology).
    expect(await screen.findByText('Nothing found for “zzz”.', { selector: 'div > p' })).toBeTruthy();
    expect(screen.queryByRole('listbox')).toBeNull();
    expect(box.getAttribute('aria-expanded')).toBe('false');
    expect(box.getAttribute('aria-controls')).toBeNull();
  });
});

describe('hitHref', () => {
  const person = hit({ kind: 'person', id: 12, project: { id: 4, name: 'Harrier seismic node' } });
  test.each([
    ['a project', hit({ kind: 'project', id: 4, project: null }), MEMBER, '/projects/4'],
    ['a spec', hit({ kind: 'spec', id: 7 }), MEMBER, '/specs/7'],
    ['a proposal', hit({ kind: 'proposal', id: 31 }), MEMBER, '/proposals/31'],
    ['a person, for a member', person, MEMBER, '/projects/4/activity?person=12'],
    ['a person, for an administrator', person, ADMIN, '/people'],
    ['oneself, sharing no project', hit({ kind: 'person', id: 3, project: null }), MEMBER, '/profile'],
  ])('when the hit is %s, then it leads to the page for it', (_what, target, viewer, href) => {
    expect(hitHref(target, viewer)).toBe(href);
  });
});
