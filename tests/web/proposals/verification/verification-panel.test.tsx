// @vitest-environment jsdom
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import { VerificationPanel } from '../../../../web/src/features/proposals/components/verification-panel';
import type { Decision } from '#shared/api/proposals';
import type { Design } from '#shared/engine/types';
import { mockFetch } from '../decision/fixtures/fetch-mock';
import { renderWithClient } from '../../helpers/render';
import {
  DESIGNER,
  differentialProposal,
  job,
  MONTE_CARLO_URL,
  monteCarloJob,
  monteCarloWithOffset,
  overrideVerification,
  proposalResult,
  RESISTOR_ERROR,
  REVIEWER,
  simulating,
  singleEndedProposal,
  sixOptions,
  status,
  STATUS_URL,
  SYSTEMS,
  tradeoffVerification,
} from './verification-fixtures';

// uPlot needs a canvas; jsdom has none. The lazy chart module is replaced by stand-ins that show what they were given.
vi.mock('../../../../web/src/features/proposals/components/verification/plots/verification-charts', () => ({
  RejectionComparisonChart: ({ plot }: { plot: { frequencyHz: number[] } }) => <div data-testid="rejection-comparison-chart">{plot.frequencyHz.length} points</div>,
  MonteCarloComparisonChart: ({ plot }: { plot: { binEdgesDb: number[] } }) => <div data-testid="monte-carlo-chart">{plot.binEdgesDb.join(' ')}</div>,
}));

let fetchMock: ReturnType<typeof mockFetch>;

afterEach(() => {
  cleanup();
  expect(fetchMock.unmocked).toEqual([]);
  vi.unstubAllGlobals();
});

const progressBar = () => screen.getByRole('progressbar') as HTMLProgressElement;
/** The data cells of a table's row, by the row's header text. */
const cellsOf = (table: HTMLElement, rowName: string) => within(within(table).getByRole('row', { name: new RegExp(`^${rowName}`) })).getAllByRole('cell').map((c) => c.textContent);

describe('VerificationPanel: a job in progress', () => {
  test('when the job is simulating, then a progress bar shows done of total and the step, and the status is read again every second until the job finishes', async () => {
    const answers = [status(simulating(2)), status(simulating(4, 6, 'Widlar source: nominal')), status(job())];
    let reads = 0;
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: answers[Math.min(reads++, answers.length - 1)] }) });
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);

    await screen.findByRole('progressbar');
    expect(progressBar().value).toBe(2);
    expect(progressBar().max).toBe(6);
    expect(progressBar().getAttribute('aria-valuetext')).toBe('2 of 6 done');
    expect(screen.getByText('2 of 6 done')).toBeTruthy();
    expect(screen.getByText('Wilson mirror: corner ICM −1.5 V, 65 °C')).toBeTruthy();
    expect((screen.getByRole('button', { name: 'Simulating…' }) as HTMLButtonElement).disabled).toBe(true);

    await waitFor(() => expect(progressBar().value).toBe(4), { timeout: 2500 });
    expect(screen.getByText('Widlar source: nominal')).toBeTruthy();

    await screen.findByRole('table', { name: /Every simulated option/ }, { timeout: 2500 });
    expect(screen.queryByRole('progressbar')).toBeNull();
    const readsWhenSettled = fetchMock.to('GET', STATUS_URL).length;
    expect(readsWhenSettled).toBe(3);
    await new Promise((resolve) => setTimeout(resolve, 1500));
    expect(fetchMock.to('GET', STATUS_URL)).toHaveLength(readsWhenSettled);
  });

  test('when a designer asks for the check, then it is posted with the CSRF token and its progress shows at once', async () => {
    fetchMock = mockFetch({
      [`GET ${STATUS_URL}`]: () => ({ body: fetchMock.to('POST', STATUS_URL).length === 0 ? status(null) : status(simulating(1)) }),
      [`POST ${STATUS_URL}`]: () => ({ status: 202, body: job({ state: 'waiting', done: 0, total: 6, step: null, startedAt: null, finishedAt: null, result: null }) }),
    });
    const user = userEvent.setup();
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);

    expect(await screen.findByText('Not simulated yet')).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Run every option through SPICE' }));

    await screen.findByRole('progressbar');
    expect(fetchMock.to('POST', STATUS_URL)).toHaveLength(1);
    const post = vi.mocked(fetch).mock.calls.find(([url, init]) => url === STATUS_URL && init?.method === 'POST')!;
    expect((post[1]!.headers as Record<string, string>)['X-CSRF-Token']).toBe('test-token');
  });

  test('when the job stopped, then its message shows with a way to run it again', async () => {
    const message = 'The server restarted while this check ran; 3 of 6 options had been simulated.';
    fetchMock = mockFetch({
      [`GET ${STATUS_URL}`]: () => ({ body: status(job({ state: 'stopped', done: 3, message, result: null })) }),
      [`POST ${STATUS_URL}`]: () => ({ status: 202, body: simulating(0) }),
    });
    const user = userEvent.setup();
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={REVIEWER} />);

    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('stopped before it finished');
    expect(alert.textContent).toContain(message);
    await user.click(within(alert).getByRole('button', { name: 'Run the SPICE check again' }));
    await waitFor(() => expect(fetchMock.to('POST', STATUS_URL)).toHaveLength(1));
  });

  test('when the job failed, then its message shows', async () => {
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(job({ state: 'failed', message: 'The simulator could not be started.', result: null })) }) });
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);

    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('could not run');
    expect(alert.textContent).toContain('The simulator could not be started.');
  });
});

describe('VerificationPanel: withdrawing a job', () => {
  const JOB_URL = `${STATUS_URL}/41`;

  test('when the requester confirms, then the job is withdrawn with a DELETE carrying the CSRF token, and shown withdrawn with a way to run it again', async () => {
    const withdrawn = job({ state: 'withdrawn', done: 2, message: 'Withdrawn by Samir Edelstein.', result: null });
    fetchMock = mockFetch({
      [`GET ${STATUS_URL}`]: () => ({ body: status(fetchMock.to('DELETE', JOB_URL).length === 0 ? simulating(2) : withdrawn) }),
      [`DELETE ${JOB_URL}`]: () => ({ body: withdrawn }),
    });
    const user = userEvent.setup();
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={REVIEWER} />);

    await user.click(await screen.findByRole('button', { name: 'Withdraw…' }));
    const confirm = screen.getByRole('group', { name: 'Confirm withdrawing the SPICE check of every option' });
    expect(confirm.textContent).toContain('the 2 of 6 done so far are not kept');
    await user.click(within(confirm).getByRole('button', { name: 'Withdraw' }));

    await waitFor(() => expect(fetchMock.to('DELETE', JOB_URL)).toHaveLength(1));
    const del = vi.mocked(fetch).mock.calls.find(([url, init]) => url === JOB_URL && init?.method === 'DELETE')!;
    expect((del[1]!.headers as Record<string, string>)['X-CSRF-Token']).toBe('test-token');
    const note = await screen.findByText('The SPICE check was withdrawn before it finished');
    expect(note.closest('[role="status"]')!.textContent).toContain('Withdrawn by Samir Edelstein.');
    expect(screen.getByRole('button', { name: 'Run the SPICE check again' })).toBeTruthy();
  });

  test('when the person keeps the job, then nothing is sent', async () => {
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(simulating(2)) }) });
    const user = userEvent.setup();
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={REVIEWER} />);

    await user.click(await screen.findByRole('button', { name: 'Withdraw…' }));
    await user.click(screen.getByRole('button', { name: 'Keep it' }));
    expect(screen.queryByRole('group', { name: /Confirm withdrawing/ })).toBeNull();
    expect(fetchMock.to('DELETE', JOB_URL)).toHaveLength(0);
  });

  test('when another designer or the requirements author looks, then no withdraw is offered (a reviewer asked for it)', async () => {
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(simulating(2)) }) });
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);
    await screen.findByRole('progressbar');
    expect(screen.queryByRole('button', { name: 'Withdraw…' })).toBeNull();
    cleanup();
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={SYSTEMS} />);
    await screen.findByRole('progressbar');
    expect(screen.queryByRole('button', { name: 'Withdraw…' })).toBeNull();
  });
});

describe('VerificationPanel: a finished check', () => {
  test('when an option is chosen, then its figures table shows the engine, ngspice, the difference, the tolerance and the verdict', async () => {
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(job()) }) });
    const user = userEvent.setup();
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);

    await user.click(await screen.findByRole('button', { name: 'Cascode mirror' }));
    const table = screen.getByRole('table', { name: /Cascode mirror at nominal conditions/ });
    // 952 µA and 949 µA differ by (952 − 949) / 949 = +0.3 % against 3 % allowed.
    const current = cellsOf(table, 'Tail current');
    expect(current.slice(0, 4)).toEqual(['952 µA', '949 µA', '+0.3 %', '±3 %']);
    expect(current[4]).toContain('✓');
    expect(current[4]).toContain('Agrees');
    expect(cellsOf(table, 'Rejection at 2.5 kHz').slice(0, 4)).toEqual(['103.4 dB', '102.9 dB', '+0.5 dB', '±1.5 dB']);
    expect(cellsOf(table, 'Tail output resistance').slice(0, 4)).toEqual(['5.48 MΩ', '5.31 MΩ', '+3.2 %', '±20 %']);
    expect(cellsOf(table, 'Collector voltage').slice(0, 4)).toEqual(['7.21 V', '7.23 V', '−20 mV', '±50 mV']);
    const corner = cellsOf(table, 'Rejection corner frequency');
    expect(corner.slice(0, 3)).toEqual(['18.2 kHz', '—', '—']);
    expect(corner[4]).toContain('Not compared');

    await user.click(screen.getByRole('button', { name: 'Widlar source' }));
    const widlar = screen.getByRole('table', { name: /Widlar source at nominal conditions/ });
    const rejection = cellsOf(widlar, 'Rejection at 2.5 kHz');
    // 72.1 dB against 69.8 dB: 2.3 dB apart, outside 1.5 dB.
    expect(rejection.slice(0, 4)).toEqual(['72.1 dB', '69.8 dB', '+2.3 dB', '±1.5 dB']);
    expect(rejection[4]).toContain('✕');
    expect(rejection[4]).toContain('Disagrees');
  });

  test('when finished, then the simulator, who asked and a tally lead, and each option has its verdict in the overview', async () => {
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(job()) }) });
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);

    const overview = await screen.findByRole('table', { name: /Every simulated option/ });
    expect(screen.getByText('ngspice-45')).toBeTruthy();
    expect(screen.getByText('Samir Edelstein')).toBeTruthy();
    expect(screen.getByText('4 of 6 agree with the engine within tolerance; 1 has figures outside it; 1 could not be simulated.')).toBeTruthy();
    expect(within(overview).getAllByRole('row')).toHaveLength(7);
    expect(within(overview).getByRole('row', { name: /Widlar source/ }).textContent).toContain('1 figure outside tolerance');
    expect(within(overview).getByRole('row', { name: /Cascode mirror/ }).textContent).toContain('Agrees');
    expect(screen.getByText(/both remain estimates to confirm by bench measurement/)).toBeTruthy();
  });

  test('when an option could not be simulated, then its message shows in place of figures', async () => {
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(job()) }) });
    const user = userEvent.setup();
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);

    const overview = await screen.findByRole('table', { name: /Every simulated option/ });
    const row = within(overview).getByRole('row', { name: /Resistor/ });
    expect(row.textContent).toContain('Not simulated');
    await user.click(within(row).getByRole('button', { name: 'Resistor' }));

    const detail = screen.getByRole('region', { name: 'SPICE check of Resistor' });
    expect(within(detail).getByRole('alert').textContent).toContain(RESISTOR_ERROR);
    expect(within(detail).queryByRole('table')).toBeNull();
  });

  test('when a corner table and the rejection curve show, then ngspice’s corner figures carry their differences and the plot gets every simulated point', async () => {
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(job()) }) });
    const user = userEvent.setup();
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);

    await user.click(await screen.findByRole('button', { name: 'Cascode mirror' }));
    const corners = screen.getByRole('table', { name: /At each corner of the spec/ });
    expect(within(corners).getAllByRole('row')).toHaveLength(5);
    // 943 µA predicted, 941 µA simulated: (943 − 941) / 941 = +0.2 %.
    const first = cellsOf(corners, 'ICM −1.5 V, −20 °C');
    expect(first[0]).toContain('941 µA');
    expect(first[0]).toContain('+0.2 %');
    expect(first[0]).toContain('Agrees');
    expect((await screen.findByTestId('rejection-comparison-chart')).textContent).toBe('6 points');
    expect(screen.getByText(/The curves differ by at most 0.5 dB/)).toBeTruthy();
    expect(screen.getByText(/From 100 MHz up only ngspice’s curve is drawn/)).toBeTruthy();
  });

  test('when the latest decision used own values, then the check opens on them; with none of them simulated, the panel says so and offers a fresh run', async () => {
    const proposal = differentialProposal();
    const wilson = proposal.result.options.find((o) => o.topology === 'wilson')!;
    const decision: Decision = { id: 11, proposalId: 7, kind: 'override', topology: 'wilson', design: wilson.design!, evaluation: null, reason: 'Stock values.', decidedById: DESIGNER.id, createdAt: '2026-03-02T11:00:00.000Z' };
    const decided = { ...proposal, status: 'decided' as const, decisions: [decision] };

    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(job({ result: proposalResult([...sixOptions(), overrideVerification()]) })) }) });
    renderWithClient(<VerificationPanel proposal={decided} user={REVIEWER} />);
    expect(await screen.findByRole('region', { name: 'SPICE check of Designer’s own values (Wilson mirror)' })).toBeTruthy();
    cleanup();

    fetchMock = mockFetch({
      [`GET ${STATUS_URL}`]: () => ({ body: { ...status(job()), currentDesign: { state: 'none', jobId: null, changes: [] } } }),
      [`POST ${STATUS_URL}`]: () => ({ status: 202, body: job({ id: 42, state: 'waiting', done: 0, total: 6, step: null, startedAt: null, finishedAt: null, result: null }) }),
    });
    const user = userEvent.setup();
    renderWithClient(<VerificationPanel proposal={decided} user={REVIEWER} />);
    expect(await screen.findByText(/The decided design \(Wilson mirror, own values\) is in no SPICE check yet\./)).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Run a fresh SPICE check of the decided design' }));
    await waitFor(() => expect(fetchMock.to('POST', STATUS_URL)).toHaveLength(1));
  });
});

describe('VerificationPanel: results bound to the design they simulated', () => {
  /** A binding as the server records it; the fingerprints are stand-ins (only equality matters to the page). */
  const binding = (fingerprint: string, design: Design) => ({
    fingerprint,
    inputs: { topology: 'wilson', design, specVersionId: 1, specVersion: 1, engineVersion: '1.0.0', rulesetVersion: 'r'.repeat(64) },
  });

  function decidedOwnValues(rcOhm: number) {
    const proposal = differentialProposal();
    const wilson = proposal.result.options.find((o) => o.topology === 'wilson')!;
    const design = { ...wilson.design!, collectorResistanceOhm: rcOhm };
    const decision: Decision = { id: 12, proposalId: 7, kind: 'override', topology: 'wilson', design, evaluation: null, reason: 'New reel.', decidedById: DESIGNER.id, createdAt: '2026-03-02T12:00:00.000Z' };
    return { proposal: { ...proposal, status: 'decided' as const, decisions: [decision], currentDesign: null }, design };
  }

  test('when the own values were decided again with another RC after the check, then their result is labelled stale with what changed, and a fresh run is offered', async () => {
    const { proposal, design } = decidedOwnValues(12_000);
    const current = { ...proposal, currentDesign: { ...(proposal.currentDesign ?? {}), binding: binding('b'.repeat(64), design) } } as unknown as typeof proposal;
    const old = { ...overrideVerification(), binding: binding('a'.repeat(64), { ...design, collectorResistanceOhm: 10_000 }) };
    fetchMock = mockFetch({
      [`GET ${STATUS_URL}`]: () => ({ body: { ...status(job({ result: proposalResult([...sixOptions(), old]) })), currentDesign: { state: 'stale', jobId: 41, changes: ['simulated RC 10 kΩ, decided 12 kΩ'] } } }),
    });
    renderWithClient(<VerificationPanel proposal={current} user={REVIEWER} />);

    const detail = await screen.findByRole('region', { name: 'SPICE check of Designer’s own values (Wilson mirror)' });
    // The label is worked out in the page from the two bindings, not copied from the server's note.
    expect(within(detail).getByText(/simulated RC 10 kΩ, decided 12 kΩ/).textContent).toMatch(/^Stale/);
    const overview = screen.getByRole('table', { name: /Every simulated option/ });
    expect(within(overview).getByRole('row', { name: /Designer’s own values/ }).textContent).toMatch(/Stale.*simulated RC 10 kΩ, decided 12 kΩ/);
    // Ranked options are simulated as ranked: no label on them.
    expect(within(overview).getByRole('row', { name: /^Cascode mirror/ }).textContent).not.toMatch(/Stale/);
    const note = screen.getByText(/Stale for the decided design \(Wilson mirror, own values\): job #41 simulated RC 10 kΩ, decided 12 kΩ\./);
    expect(note).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Run a fresh SPICE check of the decided design' })).toBeTruthy();
  });

  test('when the result simulated exactly the decided values, then it says so and no fresh run is pressed on the reviewer', async () => {
    const { proposal, design } = decidedOwnValues(12_000);
    const current = { ...proposal, currentDesign: { binding: binding('b'.repeat(64), design) } } as unknown as typeof proposal;
    const fresh = { ...overrideVerification(), binding: binding('b'.repeat(64), design) };
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: { ...status(job({ id: 43, result: proposalResult([...sixOptions(), fresh]) })), currentDesign: { state: 'current', jobId: 43, changes: [] } } }) });
    renderWithClient(<VerificationPanel proposal={current} user={REVIEWER} />);

    const detail = await screen.findByRole('region', { name: 'SPICE check of Designer’s own values (Wilson mirror)' });
    expect(within(detail).getByText(/of the current design/)).toBeTruthy();
    expect(screen.getByText(/SPICE job #43 simulated exactly the decided design \(Wilson mirror, own values\)\./)).toBeTruthy();
    expect(screen.queryByRole('button', { name: /Run a fresh SPICE check/ })).toBeNull();
  });

  test('when the result was stored before fingerprints were recorded, then it stays readable and says it is not bound to a design', async () => {
    const { proposal, design } = decidedOwnValues(12_000);
    const current = { ...proposal, currentDesign: { binding: binding('b'.repeat(64), design) } } as unknown as typeof proposal;
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: { ...status(job({ result: proposalResult([...sixOptions(), overrideVerification()]) })), currentDesign: { state: 'unbound', jobId: 41, changes: [] } } }) });
    renderWithClient(<VerificationPanel proposal={current} user={REVIEWER} />);

    const detail = await screen.findByRole('region', { name: 'SPICE check of Designer’s own values (Wilson mirror)' });
    expect(within(detail).getByText('Not bound to a design: simulated before fingerprints were recorded.')).toBeTruthy();
    expect(within(detail).getByRole('table', { name: /at nominal conditions/ })).toBeTruthy();
  });
});

describe('VerificationPanel: who may ask', () => {
  test('when the user writes requirements, then there is no button to ask, but results show', async () => {
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(null) }) });
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={SYSTEMS} />);
    expect(await screen.findByText('A designer or reviewer can ask for a SPICE check of every option.')).toBeTruthy();
    expect(screen.queryByRole('button', { name: /SPICE/ })).toBeNull();
    expect(screen.queryByRole('button', { name: /Monte Carlo/ })).toBeNull();
    expect(screen.queryByRole('spinbutton', { name: 'Runs' })).toBeNull();
    cleanup();

    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(job(), [monteCarloJob()]) }) });
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={SYSTEMS} />);
    expect(await screen.findByRole('table', { name: /Every simulated option/ })).toBeTruthy();
    expect(screen.getByRole('table', { name: /Wilson mirror: differential rejection/ })).toBeTruthy();
    expect(screen.queryByRole('button', { name: /SPICE|Monte Carlo|Run it again/ })).toBeNull();
  });
});

describe('VerificationPanel: Monte Carlo in SPICE', () => {
  test('when a Monte Carlo finished, then ngspice’s and the closed form’s yields and percentiles stand side by side, with both histograms on shared bins', async () => {
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(job(), [monteCarloJob()]) }) });
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);

    const table = await screen.findByRole('table', { name: /Wilson mirror: differential rejection at ICM −1.2 V, 85 °C \(the corner that governs its mismatch worst case\) over 198 of 200 runs/ });
    // The strain-bridge spec asks for 99 % of units at 78 dB or more.
    const yields = cellsOf(table, 'Yield at 78 dB');
    expect(yields[0]).toContain('98.5 %');
    expect(yields[0]).toContain('Falls short');
    expect(yields[1]).toContain('99.5 %');
    expect(yields[1]).toContain('Reaches it');
    expect(cellsOf(table, 'Median')).toEqual(['104.1 dB', '104.4 dB']);
    expect(cellsOf(table, '1st percentile')).toEqual(['77.4 dB', '78.6 dB']);
    expect(screen.getByText(/2 of 200 runs did not converge/)).toBeTruthy();
    expect((await screen.findByTestId('monte-carlo-chart')).textContent).toBe('75 80 85 90 95 100 105 110 115 120 125');
    expect((screen.getByRole('combobox', { name: 'Option' }) as HTMLSelectElement).value).toBe('option:wilson');
  });

  test('when a Monte Carlo is simulating, then its progress bar shows runs done of runs asked', async () => {
    const running = monteCarloJob({ state: 'simulating', done: 80, total: 200, step: 'Run 81 of 200', result: null, finishedAt: null });
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(job(), [running]) }) });
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);

    const bar = (await screen.findByRole('progressbar')) as HTMLProgressElement;
    expect(bar.value).toBe(80);
    expect(bar.max).toBe(200);
    expect(screen.getByText('Run 81 of 200')).toBeTruthy();
  });

  test('when the server refuses a Monte Carlo (409), then its message shows; runs out of range are not sent', async () => {
    const refusal = 'Monte Carlo of mismatch applies to differential outputs; this option is simulated single-ended.';
    fetchMock = mockFetch({
      [`GET ${STATUS_URL}`]: () => ({ body: status(job()) }),
      [`POST ${MONTE_CARLO_URL}`]: () => ({ status: 409, body: { error: refusal, code: 'conflict' } }),
    });
    const user = userEvent.setup();
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);

    await user.selectOptions(await screen.findByRole('combobox', { name: 'Option' }), 'option:cascode');
    const runs = screen.getByRole('spinbutton', { name: 'Runs' }) as HTMLInputElement;
    expect(runs.value).toBe('200');
    await user.clear(runs);
    await user.type(runs, '5');
    await user.click(screen.getByRole('button', { name: 'Start the Monte Carlo' }));
    expect(screen.getByText('Between 10 and 2000 runs.')).toBeTruthy();
    expect(fetchMock.to('POST', MONTE_CARLO_URL)).toHaveLength(0);

    await user.clear(runs);
    await user.type(runs, '500');
    await user.click(screen.getByRole('button', { name: 'Start the Monte Carlo' }));
    await waitFor(() => expect(fetchMock.to('POST', MONTE_CARLO_URL)).toHaveLength(1));
    expect(fetchMock.to('POST', MONTE_CARLO_URL)[0].body).toEqual({ topology: 'cascode', runs: 500 });
    expect((await screen.findByRole('alert')).textContent).toContain(refusal);
  });

  test('when the spec’s output is single-ended, then no Monte Carlo is offered, and the reason is given', async () => {
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(null) }) });
    renderWithClient(<VerificationPanel proposal={singleEndedProposal()} user={DESIGNER} />);

    expect(await screen.findByText(/Not offered for this proposal: the spec asks for a single-ended output/)).toBeTruthy();
    expect(screen.queryByRole('combobox', { name: 'Option' })).toBeNull();
    expect(screen.queryByRole('button', { name: /Monte Carlo/ })).toBeNull();
  });
});

describe('VerificationPanel: the trade-off figures', () => {
  test('when a result records groups, then the nominal table shows them under headings, with the offset in microvolts, noise in nV/√Hz and a not-predicted row explained', async () => {
    const result = proposalResult([...sixOptions(), tradeoffVerification()]);
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(job({ result })) }) });
    const user = userEvent.setup();
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);

    await user.click(await screen.findByRole('button', { name: /Designer’s own values/ }));
    const table = screen.getByRole('table', { name: /at nominal conditions/ });
    const headings = within(table).getAllByRole('columnheader').map((h) => h.textContent);
    expect(headings).toEqual(expect.arrayContaining(['Operating point', 'Gain and common-mode rejection', 'Input', 'Supply rejection', 'Bandwidth, slew rate and noise']));
    // 2.05 mV against 2.00 mV: +50 µV, within max(3 % of 2 mV, 20 µV) = 60 µV.
    const offset = cellsOf(table, 'Input offset voltage');
    expect(offset.slice(0, 4)).toEqual(['2.05 mV', '2 mV', '+50 µV', '±60 µV']);
    expect(offset[4]).toContain('Agrees');
    expect(cellsOf(table, 'Input noise density at 1 kHz').slice(0, 4)).toEqual(['8.3 nV/√Hz', '8.1 nV/√Hz', '+2.5 %', '±5 %']);
    expect(cellsOf(table, 'PSRR, positive rail, single-ended').slice(0, 4)).toEqual(['41.2 dB', '40.6 dB', '+0.6 dB', '±1.5 dB']);
    const rin = cellsOf(table, 'Input resistance');
    expect(rin.slice(0, 3)).toEqual(['not predicted', '12.3 kΩ', '—']);
    expect(rin[4]).toContain('Not predicted');
    expect(screen.getByText(/did not predict this figure, so only ngspice’s value is shown/)).toBeTruthy();
    expect(screen.getByText('Input offset voltage: tolerance 3 % of ngspice’s, at least 20 µV.')).toBeTruthy();
  });

  test('when a result was stored before groups, then its figures stay one list with no headings', async () => {
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(job()) }) });
    const user = userEvent.setup();
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);
    await user.click(await screen.findByRole('button', { name: 'Cascode mirror' }));
    const table = screen.getByRole('table', { name: /Cascode mirror at nominal conditions/ });
    expect(within(table).queryByRole('columnheader', { name: 'Operating point' })).toBeNull();
  });

  test('when a Monte Carlo carries offsets, then σ and 3σ stand beside an absent engine figure, and the absence is said', async () => {
    fetchMock = mockFetch({ [`GET ${STATUS_URL}`]: () => ({ body: status(job(), [monteCarloJob({ result: monteCarloWithOffset() })]) }) });
    renderWithClient(<VerificationPanel proposal={differentialProposal()} user={DESIGNER} />);

    const table = await screen.findByRole('table', { name: /Wilson mirror: input offset voltage at ICM 0 V, 27 °C over 200 of 200 runs/ });
    expect(cellsOf(table, 'Standard deviation σ')).toEqual(['690 µV', 'absent']);
    expect(cellsOf(table, 'At 3 σ')).toEqual(['2.07 mV', 'absent']);
    expect(cellsOf(table, 'Mean')).toEqual(['12 µV', 'absent']);
    expect(screen.getByText(/stores no statistical offset for this option/)).toBeTruthy();
  });
});
