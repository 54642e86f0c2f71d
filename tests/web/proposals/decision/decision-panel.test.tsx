// @vitest-environment jsdom
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import { formatQuantity } from '#shared/units/format-quantity';
import { DecisionPanel } from '../../../../web/src/features/proposals/components/decision-panel';
import { valueText } from '../../../../web/src/features/proposals/components/decision/override-draft';
import { mockFetch, type Call } from './fixtures/fetch-mock';
import { DESIGNER, proposalFixture, RANKING, rankedOptionOf, REVIEWER } from './fixtures/proposal-fixture';
import { renderWithClient } from '../../helpers/render';

const MEMBERS = { 'GET /api/projects/1/members': () => ({ body: { items: [DESIGNER, REVIEWER] } }) };
/** The recommendation the own-values editor starts from. */
const RANKED = rankedOptionOf('degenerated-mirror');
const RANKED_TAIL = RANKED.design!.tail as { topology: 'degenerated-mirror'; referenceResistanceOhm: number; emitterResistanceOhm: number };

let fetchMock: ReturnType<typeof mockFetch>;

afterEach(() => {
  cleanup();
  expect(fetchMock.unmocked).toEqual([]);
  vi.unstubAllGlobals();
});

/** The analysis of a design: the ranked option's own figures, with the tail current marked so the test can find it. */
function analyzeAnswer(call: Call) {
  const design = call.body as { tail: { topology: string } };
  const predicted = rankedOptionOf(design.tail.topology).predicted!;
  return { body: { ...predicted, tailCurrentA: 1.234e-3, notice: RANKING.notice } };
}

describe('DecisionPanel', () => {
  test('when choosing another option without a reason, then the reason is asked for inline and nothing is sent', async () => {
    fetchMock = mockFetch({ ...MEMBERS });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    await user.click(screen.getByRole('radio', { name: 'Choose another ranked option' }));
    await user.selectOptions(screen.getByRole('combobox', { name: 'Ranked option' }), 'wilson');
    await user.click(screen.getByRole('button', { name: /Record decision/ }));

    const reason = screen.getByRole('textbox', { name: /Reason/ });
    expect(reason.getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByText(/Give a reason/)).toBeTruthy();
    expect(document.activeElement).toBe(reason);
    expect(fetchMock.to('POST', '/api/proposals/2/decision')).toHaveLength(0);
  });

  test('when using own values without a reason, then the reason is asked for inline and nothing is sent', async () => {
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/analyze': analyzeAnswer });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    await user.click(screen.getByRole('radio', { name: 'Use my own values' }));
    await user.click(screen.getByRole('button', { name: /Record decision/ }));

    expect(screen.getByText(/Give a reason/)).toBeTruthy();
    expect(fetchMock.to('POST', '/api/proposals/2/decision')).toHaveLength(0);
  });

  test('when accepting, then no reason is needed and the recommendation is sent', async () => {
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/proposals/2/decision': () => ({ status: 201, body: proposalFixture({ status: 'decided', allowedEvents: ['approve', 'return'] }) }) });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    expect((screen.getByRole('radio', { name: 'Accept the recommendation' }) as HTMLInputElement).checked).toBe(true);
    await user.click(screen.getByRole('button', { name: /Record decision: accept the degenerated mirror/ }));

    await waitFor(() => expect(fetchMock.to('POST', '/api/proposals/2/decision')).toHaveLength(1));
    expect(fetchMock.to('POST', '/api/proposals/2/decision')[0].body).toEqual({ kind: 'accept' });
  });

  test('when the person designs in another project and reviews in this one, then the form is not offered here', async () => {
    fetchMock = mockFetch(MEMBERS);
    const designsElsewhere = { ...DESIGNER, projectRoles: [{ projectId: 1, role: 'reviewer' as const }, { projectId: 2, role: 'designer' as const }] };
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={designsElsewhere} />);

    expect(screen.getByRole('region', { name: 'Decision' })).toBeTruthy();
    expect(screen.queryByRole('region', { name: 'Your decision' })).toBeNull();
    expect(screen.queryByRole('button', { name: /Accept/ })).toBeNull();
    expect(await screen.findByText(/waits for a designer/)).toBeTruthy();
  });

  test('when the same person opens a proposal of the project where they design, then the form is offered', () => {
    fetchMock = mockFetch({ 'GET /api/projects/2/members': () => ({ body: { items: [DESIGNER] } }) });
    const designsElsewhere = { ...DESIGNER, projectRoles: [{ projectId: 1, role: 'reviewer' as const }, { projectId: 2, role: 'designer' as const }] };
    renderWithClient(<DecisionPanel proposal={proposalFixture({ projectId: 2 })} user={designsElsewhere} />);

    expect(screen.getByRole('region', { name: 'Your decision' })).toBeTruthy();
  });

  test('when nothing is recommended, then accepting is disabled with the reason why', () => {
    fetchMock = mockFetch({ ...MEMBERS });
    renderWithClient(<DecisionPanel proposal={proposalFixture({ result: { ...RANKING, recommended: null } })} user={DESIGNER} />);

    const accept = screen.getByRole('radio', { name: 'Accept the recommendation' }) as HTMLInputElement;
    expect(accept.disabled).toBe(true);
    expect(accept.getAttribute('aria-describedby')).toBeTruthy();
    expect(document.getElementById(accept.getAttribute('aria-describedby')!)?.textContent).toMatch(/No option passes every blocking check/);
  });

  test('when a resistor is typed in engineering notation, then the parsed ohms go to the analysis once typing pauses and its figures are shown', async () => {
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/analyze': analyzeAnswer });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    await user.click(screen.getByRole('radio', { name: 'Use my own values' }));
    const collector = screen.getByRole('textbox', { name: 'Collector resistor' });
    expect((collector as HTMLInputElement).value).toBe(valueText(RANKED.design!.collectorResistanceOhm, 'Ohm'));
    await user.clear(collector);
    await user.type(collector, '4k7');

    expect(screen.getByText('= 4.7 kΩ')).toBeTruthy();
    await waitFor(() => expect(fetchMock.to('POST', '/api/analyze').at(-1)?.body).toMatchObject({ collectorResistanceOhm: 4700 }));
    const sent = fetchMock.to('POST', '/api/analyze').map((c) => (c.body as { collectorResistanceOhm: number }).collectorResistanceOhm);
    // Debounced: the half-typed values (4 Ω, 4 kΩ) are never asked for.
    expect(sent).not.toContain(4);
    expect(sent).not.toContain(4000);
    expect(fetchMock.to('POST', '/api/analyze').at(-1)?.body).toMatchObject({
      tail: rankedOptionOf('degenerated-mirror').design!.tail,
      inputCommonModeV: rankedOptionOf('degenerated-mirror').design!.inputCommonModeV,
    });

    const figures = screen.getByRole('table', { name: /Key figures/ });
    const tailRow = within(figures).getByRole('row', { name: /Tail current/ });
    await waitFor(() => expect(tailRow.textContent).toContain('1.23 mA'));
    // Beside it, the ranked option's own tail current.
    expect(tailRow.textContent).toContain(formatQuantity(RANKED.predicted!.tailCurrentA, 'A'));
  });

  test('when a value cannot be read, then the field says why and no analysis is asked for it', async () => {
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/analyze': analyzeAnswer });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    await user.click(screen.getByRole('radio', { name: 'Use my own values' }));
    const reference = screen.getByRole('textbox', { name: 'Reference resistor' });
    await user.clear(reference);
    await user.type(reference, '12 V');

    expect(reference.getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByText(/unexpected unit "V"/)).toBeTruthy();
    await new Promise((resolve) => setTimeout(resolve, 500));
    const asked = fetchMock.to('POST', '/api/analyze').map((c) => (c.body as { tail: { referenceResistanceOhm: number } }).tail.referenceResistanceOhm);
    expect(asked).toEqual([RANKED_TAIL.referenceResistanceOhm]);
    expect(screen.getByText('Waiting for readable values')).toBeTruthy();
  });

  test('when the server answers 409 on submit, then its message is shown and the reason is kept', async () => {
    const message = 'Proposal 2 is decided: it cannot decide now. Allowed now: approve, return.';
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/proposals/2/decision': () => ({ status: 409, body: { error: message, code: 'invalid-transition', details: [] } }) });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    await user.click(screen.getByRole('radio', { name: 'Choose another ranked option' }));
    await user.selectOptions(screen.getByRole('combobox', { name: 'Ranked option' }), 'wilson');
    await user.type(screen.getByRole('textbox', { name: /Reason/ }), 'Wilson parts are already on the BOM.');
    await user.click(screen.getByRole('button', { name: /Record decision: choose the wilson mirror/ }));

    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain(message);
    expect((screen.getByRole('textbox', { name: /Reason/ }) as HTMLTextAreaElement).value).toBe('Wilson parts are already on the BOM.');
    expect((screen.getByRole('combobox', { name: 'Ranked option' }) as HTMLSelectElement).value).toBe('wilson');
    expect(fetchMock.to('POST', '/api/proposals/2/decision')[0].body).toEqual({ kind: 'choose', topology: 'wilson', reason: 'Wilson parts are already on the BOM.' });
  });

  test('when an unchecked override is recorded anyway, then the edited design is sent with the reason', async () => {
    fetchMock = mockFetch({
      ...MEMBERS,
      'POST /api/analyze': analyzeAnswer,
      'POST /api/proposals/2/decision': () => ({ status: 201, body: proposalFixture({ status: 'decided', allowedEvents: ['approve', 'return'] }) }),
      'GET /api/proposals/2': () => ({ body: proposalFixture({ status: 'decided', allowedEvents: ['approve', 'return'] }) }),
    });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    await user.click(screen.getByRole('radio', { name: 'Use my own values' }));
    const emitter = screen.getByRole('textbox', { name: 'Emitter resistor' });
    await user.clear(emitter);
    await user.type(emitter, '2k2');
    await user.type(screen.getByRole('textbox', { name: /Reason/ }), 'Twice the degeneration for drift.');
    await user.click(screen.getByRole('button', { name: /Record decision: own values/ }));
    // Not through the full check: a second thought first, then it goes through.
    expect(fetchMock.to('POST', '/api/proposals/2/decision')).toHaveLength(0);
    await user.click(within(screen.getByRole('alertdialog')).getByRole('button', { name: 'Record it anyway' }));

    await waitFor(() => expect(fetchMock.to('POST', '/api/proposals/2/decision')).toHaveLength(1));
    const body = fetchMock.to('POST', '/api/proposals/2/decision')[0].body as { kind: string; reason: string; design: { tail: unknown } };
    expect(body.kind).toBe('override');
    expect(body.reason).toBe('Twice the degeneration for drift.');
    expect(body.design.tail).toEqual({ ...RANKED_TAIL, emitterResistanceOhm: 2200 });
  });

  test('when the analysis refuses a value (400 with a path) or cannot solve the design (422), then each shows in place', async () => {
    let answer: { status: number; body: unknown } = { status: 400, body: { error: 'The request is not valid.', code: 'invalid-request', details: [{ path: '/tail/referenceResistanceOhm', message: 'must be <= 1000000000' }] } };
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/analyze': () => answer });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    await user.click(screen.getByRole('radio', { name: 'Use my own values' }));
    const reference = screen.getByRole('textbox', { name: 'Reference resistor' });
    await waitFor(() => expect(reference.getAttribute('aria-invalid')).toBe('true'));
    expect(screen.getByText(/The server says: must be <= 1000000000/)).toBeTruthy();
    expect(screen.getByRole('alert').textContent).toMatch(/The server refused these values/);

    answer = { status: 422, body: { error: 'This design cannot be solved: no operating point.', code: 'not-solvable' } };
    await user.clear(reference);
    await user.type(reference, '12k');
    await waitFor(() => expect(screen.getByRole('alert').textContent).toMatch(/The engine cannot solve these values/));
    expect(screen.getByRole('alert').textContent).toContain('This design cannot be solved: no operating point.');
  });
});
