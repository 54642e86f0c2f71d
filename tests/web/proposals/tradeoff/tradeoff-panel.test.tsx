// @vitest-environment jsdom
/**
 * The trade-off view (TradeoffPanel): while the sweep loads it says so; then a plot per target
 * the spec sets plus power and gain, and the figures at the what-if current beside them, each
 * against its limit. A typed current ("40 µA") is read with shared/units and sent once typing
 * pauses; text that is not a current says why and sends nothing; a current the engine cannot
 * solve shows its message. The route is answered by the real engine (tradeoffSweep on the
 * fixture's spec), so the figures shown are the engine's; the estimates notice is on the view.
 * The uPlot chart itself is replaced by a stand-in naming its chart (the canvas is not tested here).
 */
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, test, vi } from 'vitest';
import type { TradeoffInput } from '#shared/api/engine';
import { ESTIMATE_NOTICE } from '#shared/engine/index';
import { tradeoffSweep, type TradeoffSweepPoint } from '#shared/engine/tradeoff-sweep';
import type { TradeoffChart } from '../../../../web/src/features/proposals/lib/tradeoff-plot';
import { formatQuantity } from '#shared/units/format-quantity';
import { validateSpec } from '#shared/validate';
import { TradeoffPanel } from '../../../../web/src/features/proposals/components/tradeoff/tradeoff-panel';
import { json, useFetchStub } from '../../helpers/fetch-stub';
import { renderWithClient } from '../../helpers/render';
import { hydrophonePreamp, proposalOf, specOf } from '../ranking/fixtures';

vi.mock('../../../../web/src/features/proposals/components/tradeoff/lazy-tradeoff-chart', () => ({
  TradeoffChartView: ({ chart }: { chart: TradeoffChart }) => <div data-testid="tradeoff-chart">{chart.title}</div>,
}));

let hold: Promise<void> | null = null;
/** Points the next what-if request answers instead of the engine's. */
let override: TradeoffSweepPoint[] | null = null;

const stub = useFetchStub(async (request) => {
  if (request.key === 'GET /api/auth/csrf') return json(200, { token: 'test-token' });
  if (request.key !== 'POST /api/tradeoff') return undefined;
  if (hold) await hold;
  const body = request.body as TradeoffInput;
  const checked = validateSpec(body.spec);
  if (!checked.ok) return json(400, { error: 'bad spec', code: 'invalid-request', details: [] });
  const points = override && body.tailCurrentsA.length === 1 ? override : tradeoffSweep(checked.value, body.topology, body.tailCurrentsA);
  return json(200, { topology: body.topology, points, notice: ESTIMATE_NOTICE });
});

const result = hydrophonePreamp();
const option = result.options[0];
const proposal = proposalOf(result, 'hydrophone');
const tradeoffRequests = () => stub.sent.filter((r) => r.key === 'POST /api/tradeoff').map((r) => r.body as TradeoffInput);

function renderPanel() {
  hold = null;
  override = null;
  return renderWithClient(<TradeoffPanel proposal={proposal} option={option} />);
}

describe('TradeoffPanel', () => {
  test('says it is sizing while the sweep loads, then draws a plot per target the spec sets plus power and gain', async () => {
    let release!: () => void;
    renderPanel();
    hold = new Promise((resolve) => (release = resolve));
    expect(await screen.findByText(/Sizing the .* at 25 tail currents/)).toBeTruthy();
    release();
    const charts = await screen.findAllByTestId('tradeoff-chart');
    expect(charts.map((c) => c.textContent)).toEqual(['Noise', 'Bias current', 'Offset', 'Slew rate', 'Power', 'Gain']);
    const sweep = tradeoffRequests().find((b) => b.tailCurrentsA.length === 25)!;
    expect(sweep.topology).toBe(option.topology);
    expect(sweep.spec).toEqual(specOf('hydrophone'));
    expect(screen.getByText(/confirm them by SPICE simulation and bench measurement/)).toBeTruthy();
  });

  test('lists the figures at the sized current against each limit, as the engine gives them', async () => {
    renderPanel();
    const list = await screen.findByRole('region', { name: 'At the what-if current' });
    await within(list).findByText('Noise');
    const spec = validateSpec(specOf('hydrophone'));
    if (!spec.ok) throw new Error('fixture spec');
    const [engine] = tradeoffSweep(spec.value, option.topology, [option.tailCurrentWindow!.sizedAtA]);
    if (!engine.ok) throw new Error(engine.error);
    const row = (name: string) => within(list).getByText(name).closest('tr')!;
    expect(row('Noise').textContent).toContain(formatQuantity(engine.noiseVPerRtHz!, 'V/√Hz'));
    expect(row('Noise').textContent).toContain(engine.noiseVPerRtHz! <= specOf('hydrophone').noise!.maxVPerRtHz! ? 'Meets' : 'Misses');
    expect(row('Power').textContent).toContain(formatQuantity(engine.powerW, 'W'));
    expect(row('Bias current').textContent).toContain(engine.inputBiasCurrentA <= specOf('hydrophone').inputBiasCurrentMaxA! ? 'Meets' : 'Misses');
  });

  test('a typed current is read in engineering notation and sent once typing pauses', async () => {
    const user = userEvent.setup();
    renderPanel();
    await screen.findAllByTestId('tradeoff-chart');
    const field = screen.getByLabelText('Typed');
    await user.clear(field);
    await user.type(field, '40 µA');
    expect(screen.getByText(/= 40 µA/)).toBeTruthy();
    await waitFor(() => expect(tradeoffRequests().some((b) => b.tailCurrentsA.length === 1 && b.tailCurrentsA[0] === 4e-5)).toBe(true));
    const list = screen.getByRole('region', { name: 'At the what-if current' });
    await within(list).findByText(/Sized for 40 µA/);
  });

  test('text that is not a current says why and sends nothing', async () => {
    const user = userEvent.setup();
    renderPanel();
    await screen.findAllByTestId('tradeoff-chart');
    const before = tradeoffRequests().length;
    const field = screen.getByLabelText('Typed');
    await user.clear(field);
    await user.type(field, 'lots');
    expect(field.getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByText(/is not a number/)).toBeTruthy();
    await user.clear(field);
    await user.type(field, '2 A');
    expect(screen.getByText(/the sizing works from 100 nA to 100 mA/)).toBeTruthy();
    await new Promise((resolve) => setTimeout(resolve, 400));
    expect(tradeoffRequests().length).toBe(before);
  });

  test('a current the engine cannot solve shows the engine’s message in place of the figures', async () => {
    const user = userEvent.setup();
    renderPanel();
    await screen.findAllByTestId('tradeoff-chart');
    override = [{ ok: false, tailCurrentA: 0.09, error: 'the operating point could not be found (Newton did not converge)' }];
    const field = screen.getByLabelText('Typed');
    await user.clear(field);
    await user.type(field, '90m');
    const list = screen.getByRole('region', { name: 'At the what-if current' });
    expect((await within(list).findByRole('alert')).textContent).toMatch(/Not solvable at 90 mA.*Newton did not converge/);
  });
});
