// @vitest-environment jsdom
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import type { Check } from '#shared/engine/types';
import { formatDb, formatMargin, formatTargetDb } from '#shared/units/figures';
import { formatQuantity } from '#shared/units/format-quantity';
import { DecisionPanel } from '../../../../web/src/features/proposals/components/decision-panel';
import type { OptionEvaluation } from '#shared/api/proposals';
import { mockFetch, type Call } from './fixtures/fetch-mock';
import { DESIGNER, proposalFixture, RANKING, rankedOptionOf, REVIEWER } from './fixtures/proposal-fixture';
import { renderWithClient } from '../../helpers/render';

const MEMBERS = { 'GET /api/projects/1/members': () => ({ body: { items: [DESIGNER, REVIEWER] } }) };
const EVALUATION = 'POST /api/proposals/2/evaluation';
const DECIDED = proposalFixture({ status: 'decided', allowedEvents: ['approve', 'return'] });
const RANKED = rankedOptionOf('degenerated-mirror');
const RANKED_TAIL = RANKED.design!.tail as { topology: 'degenerated-mirror'; referenceResistanceOhm: number; emitterResistanceOhm: number };
/** What a 2k2 mirror emitter resistor makes of the ranked design. */
const EDITED_TAIL = { ...RANKED_TAIL, emitterResistanceOhm: 2200 };

let fetchMock: ReturnType<typeof mockFetch>;

afterEach(() => {
  cleanup();
  expect(fetchMock.unmocked).toEqual([]);
  vi.unstubAllGlobals();
});

/** The nominal what-if of a design: the ranked option's own figures. */
function analyzeAnswer(call: Call) {
  const design = call.body as { tail: { topology: string } };
  return { body: { ...rankedOptionOf(design.tail.topology).predicted!, notice: RANKING.notice } };
}

/** The server's evaluation of own values: the ranked degenerated mirror's, as an override (rank 0). */
function passingEvaluation(): OptionEvaluation {
  return { ...rankedOptionOf('degenerated-mirror'), rank: 0 };
}

/** The same with the rejection at the spec's (differential) output short of its target. */
function failingEvaluation(): OptionEvaluation {
  const option = passingEvaluation();
  const { title, kind, figure } = option.checks.find((c) => c.rule === 'cmrr-target')!;
  const short: Check = {
    rule: 'cmrr-target',
    title,
    kind,
    figure,
    passed: false,
    severity: 'blocking',
    reason: "CMRR at the spec's differential output 93.4 dB predicted at 2.5 kHz (differential, mismatch-limited worst case) against 92 dB required + 6 dB margin: 4.6 dB short.",
    margin: -4.6,
    marginUnit: 'dB',
    applicable: true,
    evaluated: true,
  };
  return { ...option, passes: false, checks: option.checks.map((c) => (c.rule === 'cmrr-target' ? short : c)) };
}

/** Opens own values and types a mirror emitter resistor of 2k2. */
async function editEmitter(user: ReturnType<typeof userEvent.setup>) {
  await user.click(screen.getByRole('radio', { name: 'Use my own values' }));
  const emitter = screen.getByRole('textbox', { name: 'Emitter resistor' });
  await user.clear(emitter);
  await user.type(emitter, '2k2');
}

const checkButton = () => screen.getByRole('button', { name: /every rule at every corner|Check again at every corner/ });

describe('Full check of own values', () => {
  test('when the full check is asked for, then the edited design goes to the evaluation in ohms and every check shows with its verdict, reason and margin', async () => {
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/analyze': analyzeAnswer, [EVALUATION]: () => ({ body: passingEvaluation() }) });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    await editEmitter(user);
    await user.click(checkButton());

    await waitFor(() => expect(fetchMock.to('POST', '/api/proposals/2/evaluation')).toHaveLength(1));
    const { design } = fetchMock.to('POST', '/api/proposals/2/evaluation')[0].body as { design: Record<string, unknown> };
    expect(design).toEqual({ ...RANKED.design, tail: EDITED_TAIL });

    const result = await screen.findByRole('group', { name: 'Full check result' });
    expect(within(result).getByText('Passes every blocking check')).toBeTruthy();
    // The evaluation answered is the ranked option's, so the figure and the ranked one are the same number.
    const f = RANKED.figures!;
    const rejection = within(result).getByText(`Rejection at ${formatQuantity(f.cmrrFrequencyHz, 'Hz')}, tail-limited`).nextElementSibling!;
    expect(rejection.textContent).toBe(
      `${formatDb(f.cmrrAtFrequencyDb)} against ${formatTargetDb(f.cmrrRequiredDb)} + ${formatTargetDb(f.cmrrMarginRequiredDb)} margin (${formatMargin(f.cmrrMarginDb, 'dB')}) · ranked option ${formatDb(f.cmrrAtFrequencyDb)}`,
    );
    expect(within(result).getByText(f.worstCmrrCorner)).toBeTruthy();
    const checks = within(result).getByRole('table', { name: /Every check of your values/ });
    const row = within(checks).getByRole('row', { name: /Rejection at the spec's output/ });
    expect(row.textContent).toContain('Holds');
    const target = RANKED.checks.find((c) => c.rule === 'cmrr-target')!;
    expect(target.margin).toBeGreaterThan(0);
    expect(row.textContent).toContain(formatMargin(target.margin!, 'dB'));
    expect(row.textContent).toContain(target.reason);
    expect(within(checks).getAllByRole('row')).toHaveLength(passingEvaluation().checks.length + 1);
    expect(screen.getByText('Up to date with the values in the fields.')).toBeTruthy();
  });

  test('when a value changes after the check, then the result stays readable but is marked out of date', async () => {
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/analyze': analyzeAnswer, [EVALUATION]: () => ({ body: passingEvaluation() }) });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    await editEmitter(user);
    await user.click(checkButton());
    await screen.findByRole('group', { name: 'Full check result' });

    const collector = screen.getByRole('textbox', { name: 'Collector resistor' });
    await user.clear(collector);
    await user.type(collector, '2k4');

    expect(screen.getByText(/Values changed since this check/)).toBeTruthy();
    expect(screen.getByText('Out of date')).toBeTruthy();
    const stale = screen.getByRole('group', { name: 'Full check result, out of date' });
    expect(within(stale).getByRole('table', { name: /values changed since this check/ })).toBeTruthy();
    expect(checkButton().textContent).toBe('Check again at every corner');
    expect(fetchMock.to('POST', '/api/proposals/2/evaluation')).toHaveLength(1);
  });

  test('when a failing override is recorded, then the designer is asked to confirm, and confirming records it', async () => {
    fetchMock = mockFetch({
      ...MEMBERS,
      'POST /api/analyze': analyzeAnswer,
      [EVALUATION]: () => ({ body: failingEvaluation() }),
      'POST /api/proposals/2/decision': () => ({ status: 201, body: DECIDED }),
      'GET /api/proposals/2': () => ({ body: DECIDED }),
    });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    await editEmitter(user);
    await user.click(checkButton());
    const result = await screen.findByRole('group', { name: 'Full check result' });
    expect(within(result).getByText('Short on 1 blocking check')).toBeTruthy();
    expect(within(result).getByRole('row', { name: /Rejection at the spec's output/ }).textContent).toContain('−4.6 dB');

    await user.type(screen.getByRole('textbox', { name: /Reason/ }), 'The bench build shows 6 dB more than the model.');
    await user.click(screen.getByRole('button', { name: /Record decision: own values/ }));

    const confirm = screen.getByRole('alertdialog');
    expect(confirm.textContent).toContain("This override falls short on: Rejection at the spec's output. Record it anyway?");
    expect(document.activeElement).toBe(confirm);
    expect(fetchMock.to('POST', '/api/proposals/2/decision')).toHaveLength(0);

    await user.click(within(confirm).getByRole('button', { name: 'Record it anyway' }));
    await waitFor(() => expect(fetchMock.to('POST', '/api/proposals/2/decision')).toHaveLength(1));
    const body = fetchMock.to('POST', '/api/proposals/2/decision')[0].body as { kind: string; reason: string; design: { tail: unknown } };
    expect(body).toMatchObject({ kind: 'override', reason: 'The bench build shows 6 dB more than the model.' });
    expect(body.design.tail).toEqual(EDITED_TAIL);
  });

  test('when an unchecked override is recorded, then Escape keeps editing, sends nothing and leads to the full check', async () => {
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/analyze': analyzeAnswer });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    await editEmitter(user);
    await user.type(screen.getByRole('textbox', { name: /Reason/ }), 'Twice the degeneration for drift.');
    await user.click(screen.getByRole('button', { name: /Record decision: own values/ }));

    expect(screen.getByRole('alertdialog').textContent).toMatch(/not been through the full check yet\. Record it anyway\?/);
    await user.keyboard('{Escape}');

    expect(screen.queryByRole('alertdialog')).toBeNull();
    expect(document.activeElement).toBe(checkButton());
    expect(fetchMock.to('POST', '/api/proposals/2/decision')).toHaveLength(0);
  });

  test('when the override passes its check, then it is recorded without a second question', async () => {
    fetchMock = mockFetch({
      ...MEMBERS,
      'POST /api/analyze': analyzeAnswer,
      [EVALUATION]: () => ({ body: passingEvaluation() }),
      'POST /api/proposals/2/decision': () => ({ status: 201, body: DECIDED }),
      'GET /api/proposals/2': () => ({ body: DECIDED }),
    });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    await editEmitter(user);
    await user.click(checkButton());
    await screen.findByRole('group', { name: 'Full check result' });
    await user.type(screen.getByRole('textbox', { name: /Reason/ }), 'Twice the degeneration for drift.');
    await user.click(screen.getByRole('button', { name: /Record decision: own values/ }));

    await waitFor(() => expect(fetchMock.to('POST', '/api/proposals/2/decision')).toHaveLength(1));
    expect(screen.queryByRole('alertdialog')).toBeNull();
  });

  test('when the check is refused (400 with paths) or forbidden (403), then each shows in place', async () => {
    let answer: { status: number; body: unknown } = {
      status: 400,
      body: {
        error: 'The request is not valid.',
        code: 'invalid-request',
        details: [
          { path: '/design/tail/emitterResistanceOhm', message: 'must be > 0' },
          { path: '/design/supply/negativeV', message: 'must be <= 0' },
        ],
      },
    };
    fetchMock = mockFetch({ ...MEMBERS, 'POST /api/analyze': analyzeAnswer, [EVALUATION]: () => answer });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposalFixture()} user={DESIGNER} />);

    await editEmitter(user);
    await user.click(checkButton());

    const emitter = screen.getByRole('textbox', { name: 'Emitter resistor' });
    await waitFor(() => expect(emitter.getAttribute('aria-invalid')).toBe('true'));
    expect(screen.getByText(/The server says: must be > 0/)).toBeTruthy();
    const alert = screen.getByRole('alert');
    expect(alert.textContent).toMatch(/The server refused these values/);
    expect(alert.textContent).toContain('/design/supply/negativeV');
    expect(alert.textContent).not.toContain('/design/tail/emitterResistanceOhm');

    answer = { status: 403, body: { error: 'You do not have permission to do this.', code: 'forbidden' } };
    await user.click(checkButton());
    await waitFor(() => expect(screen.getByRole('alert').textContent).toContain('You do not have permission to do this.'));
    expect(emitter.getAttribute('aria-invalid')).toBeNull();
  });
});
