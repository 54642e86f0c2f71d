// @vitest-environment jsdom
/**
 * The spec form's optional targets and corners: typed in engineering notation as datasheets
 * quote them, saved in SI; a target left empty (or holding only its defaults) is not sent, so it
 * is not checked; a half-filled target is refused beside its field before anything is sent.
 * Prefixes are [SI]: n = 1e-9, µ = 1e-6, m = 1e-3, k = 1e3, M = 1e6, p = 1e-12; 1 V/µs = 1e6 V/s.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import specSchema from '#shared/schema/spec.schema.json';
import { validateSpec } from '#shared/validate';
import { saveSpecVersion } from '../../../web/src/features/specs/api/spec-queries';
import { SpecForm, type SpecDraft } from '../../../web/src/features/specs/components/spec-form';
import { mockFetch } from './fetch-mock';

const SAVED: SpecDraft = { title: 'Bridge input', supply: { positiveV: 12, negativeV: -12 }, gain: { target: 100 }, cmrr: { minDb: 80 } };

let network: ReturnType<typeof mockFetch> | undefined;
afterEach(() => {
  cleanup();
  network?.assertNoUnexpectedRequests();
  vi.unstubAllGlobals();
});

function renderForm(initial: SpecDraft = SAVED) {
  network = mockFetch({
    'GET /api/schema/spec': { status: 200, body: specSchema },
    'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
    'PUT /api/specs/7': { status: 200, body: {} },
  });
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const onSave = vi.fn((draft: SpecDraft) => saveSpecVersion(7, { title: String(draft.title ?? ''), payload: draft }));
  render(
    <QueryClientProvider client={queryClient}>
      <SpecForm initial={initial} onSave={onSave} saveLabel="Save as new version" />
    </QueryClientProvider>,
  );
  return { puts: () => network!.requests.filter((r) => r.key === 'PUT /api/specs/7') };
}

/** The text of the elements an input's aria-describedby names. */
function description(input: HTMLElement): string {
  return (input.getAttribute('aria-describedby') ?? '')
    .split(/\s+/)
    .map((id) => document.getElementById(id)?.textContent ?? '')
    .join(' ');
}

async function typeInto(label: RegExp, text: string) {
  const input = await screen.findByLabelText(label);
  await userEvent.clear(input);
  await userEvent.type(input, text);
  return input;
}

const save = () => userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));
type Payload = Record<string, unknown> & { noise?: unknown; offset?: unknown };
const payloadOf = (body: unknown) => (body as { payload: Payload }).payload;

describe('SpecForm: optional targets and corners', () => {
  test('when nothing is typed, then no target is sent (none is checked) and the corners go with their defaults', async () => {
    const { puts } = renderForm();
    await screen.findByLabelText(/^Largest noise density/);
    await save();
    await waitFor(() => expect(puts()).toHaveLength(1));
    const payload = payloadOf(puts()[0].body);
    for (const target of ['noise', 'inputBiasCurrentMaxA', 'offset', 'slewRateMinVPerS', 'bandwidthMinHz', 'psrrMinDb', 'linearInputRangeMinV', 'betaRange']) {
      expect(payload).not.toHaveProperty(target);
    }
    expect(payload.supplyTolerance).toEqual({ positivePercent: 5, negativePercent: 5 });
    expect((payload.resistors as { tempcoPpmPerC: number }).tempcoPpmPerC).toBe(100);
    // What the form sends is what the server accepts
    expect(validateSpec(payload).ok).toBe(true);
  });

  test('when every target and corner is typed as a datasheet quotes it, then the server gets each in SI', async () => {
    const { puts } = renderForm();
    const typed: [RegExp, string][] = [
      [/^Largest noise density/, '8 nV/√Hz'],
      [/^Noise frequency/, '1 kHz'],
      [/^Largest input bias current/, '3 µA'],
      [/^Largest offset(?! drift)/, '2 mV'],
      [/^Largest offset drift/, '5 µV/°C'],
      [/^Offset confidence/, '4'],
      [/^Linear input range/, '20 mV'],
      [/^Lowest slew rate/, '2 V/µs'],
      [/^Lowest bandwidth/, '1 MHz'],
      [/^PSRR of the positive rail/, '60 dB'],
      [/^PSRR of the negative rail/, '55'],
      [/^Load capacitance/, '20 pF'],
      [/^Tolerance of the positive rail/, '2 %'],
      [/^Tolerance of the negative rail/, '10'],
      [/^Lowest current gain/, '80'],
      [/^Highest current gain/, '400'],
      [/^Temperature coefficient/, '50 ppm/°C'],
    ];
    for (const [label, text] of typed) await typeInto(label, text);
    expect(description(screen.getByLabelText(/^Lowest slew rate/))).toMatch(/= 2 MV\/s/);
    await save();
    await waitFor(() => expect(puts()).toHaveLength(1));
    const payload = payloadOf(puts()[0].body);
    const near = (actual: unknown, expected: number) => expect(Math.abs((actual as number) - expected)).toBeLessThanOrEqual(1e-12 * expected);
    const noise = payload.noise as { maxVPerRtHz: number; atFrequencyHz: number };
    near(noise.maxVPerRtHz, 8e-9);
    near(noise.atFrequencyHz, 1000);
    near(payload.inputBiasCurrentMaxA, 3e-6);
    const offset = payload.offset as { maxV: number; driftMaxVPerC: number; sigmas: number };
    near(offset.maxV, 2e-3);
    near(offset.driftMaxVPerC, 5e-6);
    expect(offset.sigmas).toBe(4);
    near(payload.linearInputRangeMinV, 0.02);
    near(payload.slewRateMinVPerS, 2e6);
    near(payload.bandwidthMinHz, 1e6);
    expect(payload.psrrMinDb).toEqual({ positive: 60, negative: 55 });
    near(payload.loadCapacitanceF, 20e-12);
    expect(payload.supplyTolerance).toEqual({ positivePercent: 2, negativePercent: 10 });
    expect(payload.betaRange).toEqual({ min: 80, max: 400 });
    expect((payload.resistors as { tempcoPpmPerC: number }).tempcoPpmPerC).toBe(50);
    expect(validateSpec(payload).ok).toBe(true);
  });

  test('when a noise limit is typed without its frequency, then the form says the frequency is required and sends nothing', async () => {
    const { puts } = renderForm();
    await typeInto(/^Largest noise density/, '8n');
    await save();
    const frequency = screen.getByLabelText(/^Noise frequency/);
    await waitFor(() => expect(description(frequency)).toContain('is required with the largest noise density'));
    expect(puts()).toHaveLength(0);
  });

  test('when only the offset confidence is changed, then the form asks for a limit beside the largest offset and sends nothing', async () => {
    const { puts } = renderForm();
    await typeInto(/^Offset confidence/, '4');
    await save();
    const limit = screen.getByLabelText(/^Largest offset(?! drift)/);
    await waitFor(() => expect(description(limit)).toContain('is required unless the largest offset drift is given'));
    expect(puts()).toHaveLength(0);
  });

  test('when a target is typed and then cleared again, then it is not sent', async () => {
    const { puts } = renderForm();
    const limit = await typeInto(/^Largest noise density/, '8n');
    await userEvent.clear(limit);
    const drift = await typeInto(/^Largest offset drift/, '5u');
    await userEvent.clear(drift);
    await save();
    await waitFor(() => expect(puts()).toHaveLength(1));
    const payload = payloadOf(puts()[0].body);
    expect(payload).not.toHaveProperty('noise');
    expect(payload).not.toHaveProperty('offset');
  });

  test('when a saved spec has targets, then the form shows them in engineering notation and saves them unchanged', async () => {
    const initial = { ...SAVED, noise: { maxVPerRtHz: 8e-9, atFrequencyHz: 1000 }, slewRateMinVPerS: 2e6, offset: { driftMaxVPerC: 5e-6, sigmas: 3 } };
    const { puts } = renderForm(initial);
    expect(((await screen.findByLabelText(/^Largest noise density/)) as HTMLInputElement).value).toBe('8n');
    expect((screen.getByLabelText(/^Lowest slew rate/) as HTMLInputElement).value).toBe('2M');
    expect((screen.getByLabelText(/^Largest offset drift/) as HTMLInputElement).value).toBe('5µ');
    await save();
    await waitFor(() => expect(puts()).toHaveLength(1));
    const payload = payloadOf(puts()[0].body);
    expect(payload.noise).toEqual(initial.noise);
    expect(payload.slewRateMinVPerS).toBe(2e6);
    expect(payload.offset).toEqual(initial.offset);
  });
});
