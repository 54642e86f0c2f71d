// @vitest-environment jsdom
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import { formatMargin } from '#shared/units/figures';
import { ReviewPanel } from '../../../../web/src/features/proposals/components/review-panel';
import { mockFetch } from './fixtures/fetch-mock';
import { chooseDecision, decidedProposal, DESIGNER, proposalFixture, rankedOptionOf, REVIEWER } from './fixtures/proposal-fixture';
import { renderWithClient } from '../../helpers/render';

/** The verification status as the server answers it, with how the check stands for the decided design. */
const verificationWith = (currentDesign: { state: string; jobId: number | null; changes: string[] }) => ({
  'GET /api/proposals/2/verification': () => ({ body: { verification: null, monteCarlo: [], currentDesign } }),
});
const NOT_SIMULATED = verificationWith({ state: 'none', jobId: null, changes: [] });
const MEMBERS = { 'GET /api/projects/1/members': () => ({ body: { items: [DESIGNER, REVIEWER] } }), ...NOT_SIMULATED };

let fetchMock: ReturnType<typeof mockFetch>;

afterEach(() => {
  cleanup();
  expect(fetchMock.unmocked).toEqual([]);
  vi.unstubAllGlobals();
});

describe('ReviewPanel', () => {
  test('when returning without a comment, then the comment is asked for and nothing is sent; with one, the return is sent', async () => {
    const returned = proposalFixture({ status: 'returned', allowedEvents: ['decide'], decisions: [chooseDecision('widlar')] });
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/proposals/2/review': () => ({ status: 201, body: returned }) });
    const user = userEvent.setup();
    renderWithClient(<ReviewPanel proposal={decidedProposal(chooseDecision('widlar'))} user={REVIEWER} />);

    await user.click(screen.getByRole('button', { name: 'Send back for rework' }));
    const comment = screen.getByRole('textbox', { name: /Comment/ });
    expect(comment.getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByText(/sending back needs a comment/)).toBeTruthy();
    expect(document.activeElement).toBe(comment);
    expect(fetchMock.to('POST', '/api/proposals/2/review')).toHaveLength(0);

    await user.type(comment, 'The Widlar misses the rejection target by 13 dB.');
    await user.click(screen.getByRole('button', { name: 'Send back for rework' }));
    await waitFor(() => expect(fetchMock.to('POST', '/api/proposals/2/review')).toHaveLength(1));
    expect(fetchMock.to('POST', '/api/proposals/2/review')[0].body).toEqual({ verdict: 'return', comment: 'The Widlar misses the rejection target by 13 dB.' });
  });

  test('when signing off a design that holds every blocking check, then no comment is needed', async () => {
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/proposals/2/review': () => ({ status: 201, body: proposalFixture({ status: 'approved', allowedEvents: [] }) }) });
    const user = userEvent.setup();
    renderWithClient(<ReviewPanel proposal={decidedProposal(chooseDecision('wilson'))} user={REVIEWER} />);

    const signOff = screen.getByRole('button', { name: 'Sign off' });
    await waitFor(() => expect(fetchMock.to('GET', '/api/proposals/2/verification')).toHaveLength(1));
    expect((signOff as HTMLButtonElement).disabled).toBe(false);
    await user.click(signOff);
    await waitFor(() => expect(fetchMock.to('POST', '/api/proposals/2/review')).toHaveLength(1));
    expect(fetchMock.to('POST', '/api/proposals/2/review')[0].body).toEqual({ verdict: 'approve' });
  });

  test('when the decided design is short on a blocking check, then Sign off is held with the reason until a comment is written', async () => {
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/proposals/2/review': () => ({ status: 201, body: proposalFixture({ status: 'approved', allowedEvents: [] }) }) });
    const user = userEvent.setup();
    renderWithClient(<ReviewPanel proposal={decidedProposal(chooseDecision('widlar'))} user={REVIEWER} />);

    const signOff = screen.getByRole('button', { name: 'Sign off' }) as HTMLButtonElement;
    expect(signOff.disabled).toBe(true);
    const hold = screen.getByTestId('sign-off-hold');
    expect(hold.textContent).toMatch(/short on 1 blocking check: say in the comment why/);
    expect(signOff.getAttribute('aria-describedby')).toBe(hold.id);

    await user.type(screen.getByRole('textbox', { name: /Comment/ }), '   ');
    expect(signOff.disabled).toBe(true);
    await user.type(screen.getByRole('textbox', { name: /Comment/ }), 'Rejection target relaxed for the prototype.');
    expect(signOff.disabled).toBe(false);
    await user.click(signOff);
    await waitFor(() => expect(fetchMock.to('POST', '/api/proposals/2/review')).toHaveLength(1));
    expect(fetchMock.to('POST', '/api/proposals/2/review')[0].body).toEqual({ verdict: 'approve', comment: 'Rejection target relaxed for the prototype.' });
  });

  test('when the only SPICE check simulated another design, then Sign off is held until the reviewer accepts it and says why; the request carries the flag', async () => {
    const stale = verificationWith({ state: 'stale', jobId: 31, changes: ['simulated RC 10 kΩ, decided 12 kΩ'] });
    fetchMock = mockFetch({ ...MEMBERS, ...stale, 'POST /api/proposals/2/review': () => ({ status: 201, body: proposalFixture({ status: 'approved', allowedEvents: [] }) }) });
    const user = userEvent.setup();
    renderWithClient(<ReviewPanel proposal={decidedProposal(chooseDecision('wilson'))} user={REVIEWER} />);

    const accept = await screen.findByRole('checkbox', { name: /Sign off on it anyway/ });
    expect(accept.closest('label')!.textContent).toContain('(job #31) simulated another design: simulated RC 10 kΩ, decided 12 kΩ.');
    const signOff = screen.getByRole('button', { name: 'Sign off' }) as HTMLButtonElement;
    expect(signOff.disabled).toBe(true);
    expect(screen.getByTestId('sign-off-hold').textContent).toMatch(/simulated another design: run a fresh check, or tick/);

    await user.click(accept);
    expect(signOff.disabled).toBe(true);
    expect(screen.getByTestId('sign-off-hold').textContent).toMatch(/why that SPICE check is enough/);
    await user.type(screen.getByRole('textbox', { name: /Comment/ }), 'Only RC moved; the gain scales with it as predicted.');
    expect(signOff.disabled).toBe(false);
    await user.click(signOff);
    await waitFor(() => expect(fetchMock.to('POST', '/api/proposals/2/review')).toHaveLength(1));
    expect(fetchMock.to('POST', '/api/proposals/2/review')[0].body).toEqual({
      verdict: 'approve',
      comment: 'Only RC moved; the gain scales with it as predicted.',
      acceptStaleVerification: true,
    });
  });

  test('when the decided option is shown, then every one of its checks is listed with verdict, reason and margin, failures first', async () => {
    fetchMock = mockFetch({ ...MEMBERS });
    renderWithClient(<ReviewPanel proposal={decidedProposal(chooseDecision('widlar'))} user={REVIEWER} />);

    const table = screen.getByRole('table', { name: /Every check of the decided option/ });
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows).toHaveLength(rankedOptionOf('widlar').checks.length);
    expect(rows[0].textContent).toMatch(/Short/);
    expect(rows[0].textContent).toMatch(/Rejection at the spec's output/);
    const short = rankedOptionOf('widlar').checks.find((c) => c.rule === 'cmrr-target')!;
    expect(short.passed).toBe(false);
    expect(rows[0].textContent).toContain(short.reason);
    expect(rows[0].textContent).toContain(formatMargin(short.margin!, short.marginUnit));
    expect(await screen.findByText('Priya Valcourt')).toBeTruthy();
  });

  test('when the server refuses with own-decision, then its message is shown in place and the comment kept', async () => {
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/proposals/2/review': () => ({ status: 403, body: { error: 'Nobody reviews their own decision.', code: 'own-decision', details: [] } }) });
    const user = userEvent.setup();
    renderWithClient(<ReviewPanel proposal={decidedProposal(chooseDecision('wilson'))} user={REVIEWER} />);

    await user.type(screen.getByRole('textbox', { name: /Comment/ }), 'Fine by me.');
    await user.click(screen.getByRole('button', { name: 'Sign off' }));

    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('Nobody reviews their own decision.');
    expect((screen.getByRole('textbox', { name: /Comment/ }) as HTMLTextAreaElement).value).toBe('Fine by me.');
  });

  test('when the viewer is a designer, then there is no review form, only the past reviews', async () => {
    const review = { id: 5, proposalId: 2, decisionId: 11, verdict: 'return' as const, comment: 'Check the low end.', reviewerId: REVIEWER.id, createdAt: '2026-03-02T10:00:00.000Z' };
    fetchMock = mockFetch({ ...MEMBERS });
    renderWithClient(<ReviewPanel proposal={proposalFixture({ status: 'returned', decisions: [chooseDecision('wilson')], reviews: [review] })} user={DESIGNER} />);

    expect(screen.queryByRole('button', { name: 'Sign off' })).toBeNull();
    expect(screen.getByText('Check the low end.')).toBeTruthy();
    expect(await screen.findByText('Samir Edelstein')).toBeTruthy();
  });
});
