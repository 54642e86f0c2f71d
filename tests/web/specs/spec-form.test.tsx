// @vitest-environment jsdom
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import specSchema from '#shared/schema/spec.schema.json';
import { saveSpecVersion } from '../../../web/src/features/specs/api/spec-queries';
import { SpecForm, type SpecDraft } from '../../../web/src/features/specs/components/spec-form';
import { mockFetch, type MockAnswer } from './fetch-mock';

const SAVED: SpecDraft = { title: 'Bridge input', supply: { positiveV: 12, negativeV: -12 }, gain: { target: 100 }, cmrr: { minDb: 80 } };

let network: ReturnType<typeof mockFetch> | undefined;
afterEach(() => {
  cleanup();
  network?.assertNoUnexpectedRequests();
  vi.unstubAllGlobals();
});

function renderForm(saveAnswer: MockAnswer | ((body: unknown) => MockAnswer)) {
  network = mockFetch({
    'GET /api/schema/spec': { status: 200, body: specSchema },
    'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
    'PUT /api/specs/7': saveAnswer,
  });
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const onSave = vi.fn((draft: SpecDraft) => saveSpecVersion(7, { title: String(draft.title ?? ''), payload: draft }));
  render(
    <QueryClientProvider client={queryClient}>
      <SpecForm initial={SAVED} onSave={onSave} saveLabel="Save as new version" />
    </QueryClientProvider>,
  );
  return { onSave, puts: () => network!.requests.filter((r) => r.key === 'PUT /api/specs/7') };
}

/** The text of the elements an input's aria-describedby names. */
function description(input: HTMLElement): string {
  return (input.getAttribute('aria-describedby') ?? '')
    .split(/\s+/)
    .map((id) => document.getElementById(id)?.textContent ?? '')
    .join(' ');
}

describe('SpecForm', () => {
  test('when the server answers 400 with details, then each message shows beside its field and nothing typed is lost', async () => {
    const message = 'must leave 3 V of headroom below supply.positiveV (12 V), got 11 V';
    const { puts } = renderForm({ status: 400, body: { error: 'The spec is not valid.', code: 'invalid-request', details: [{ path: '/payload/supply/negativeV', message }] } });
    const title = await screen.findByLabelText(/^Title/);
    await userEvent.clear(title);
    await userEvent.type(title, 'Bridge input, rev B');
    const rail = screen.getByLabelText(/^Negative rail/);
    await userEvent.clear(rail);
    await userEvent.type(rail, '-11 V');
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));

    await waitFor(() => expect(description(rail)).toContain(message));
    expect(rail.getAttribute('aria-invalid')).toBe('true');
    expect(document.activeElement).toBe(rail);
    expect(screen.getByText(/The spec is not valid\. The problem is marked beside its field\./)).toBeTruthy();
    expect((title as HTMLInputElement).value).toBe('Bridge input, rev B');
    expect((rail as HTMLInputElement).value).toBe('-11 V');
    expect(puts()).toHaveLength(1);
    expect((puts()[0].body as { payload: { supply: { negativeV: number } } }).payload.supply.negativeV).toBe(-11);
  });

  test('when the field the server named is edited, then its message goes', async () => {
    const message = 'server says no';
    renderForm({ status: 400, body: { error: 'The spec is not valid.', details: [{ path: '/payload/supply/negativeV', message }] } });
    await userEvent.click(await screen.findByRole('button', { name: 'Save as new version' }));
    const rail = screen.getByLabelText(/^Negative rail/);
    await waitFor(() => expect(description(rail)).toContain(message));
    await userEvent.type(rail, '0');
    expect(screen.queryByText(message)).toBeNull();
  });

  test('when a quantity cannot be read, then the form does not submit', async () => {
    const { onSave, puts } = renderForm({ status: 200, body: {} });
    const rail = await screen.findByLabelText(/^Positive rail/);
    await userEvent.clear(rail);
    await userEvent.type(rail, 'twelve');
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));
    expect(screen.getByText(/cannot read 'twelve' as a quantity in V/)).toBeTruthy();
    expect(screen.queryByText('is required')).toBeNull();
    expect(onSave).not.toHaveBeenCalled();
    expect(puts()).toHaveLength(0);
  });

  test('when a value breaks the schema or a cross-field rule, then the browser says so beside the field and does not send', async () => {
    const { puts } = renderForm({ status: 200, body: {} });
    const cmrr = await screen.findByLabelText(/^Minimum CMRR/);
    await userEvent.clear(cmrr);
    await userEvent.type(cmrr, '250');
    const rail = screen.getByLabelText(/^Negative rail/);
    await userEvent.clear(rail);
    await userEvent.type(rail, '14');
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));
    await waitFor(() => expect(description(cmrr)).toContain('must be <= 200 dB, got 250 dB'));
    expect(description(rail)).toContain('must be below the positive rail (12 V), got 14 V');
    expect(puts()).toHaveLength(0);
  });

  test('when the save succeeds, then the server gets the numbers the person typed, in SI', async () => {
    const { puts } = renderForm({ status: 200, body: {} });
    const rail = await screen.findByLabelText(/^Positive rail/);
    await userEvent.clear(rail);
    await userEvent.type(rail, '15 V');
    const capacitance = screen.getByLabelText(/^Tail capacitance/);
    await userEvent.clear(capacitance);
    await userEvent.type(capacitance, '2 pF');
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));
    await waitFor(() => expect(puts()).toHaveLength(1));
    const body = puts()[0].body as { title: string; payload: { supply: { positiveV: number }; tailCapacitanceF: number; topologies: string[] } };
    expect(body.title).toBe('Bridge input');
    expect(body.payload.supply.positiveV).toBe(15);
    expect(body.payload.tailCapacitanceF).toBeCloseTo(2e-12, 24);
    expect(body.payload.topologies).toHaveLength(6);
  });

  test('when a value is implausible for its field, then the form shows the value understood with a note, and still saves it', async () => {
    const { puts } = renderForm({ status: 200, body: {} });
    const budget = await screen.findByLabelText(/^Power budget/);
    await userEvent.clear(budget);
    await userEvent.type(budget, '60M');
    // 60M is 60 MW in SI (M is mega); a stage's budget is watts at most, and 60 mW would be usual
    expect(description(budget)).toMatch(/= 60 MW/);
    expect(description(budget)).toMatch(/60 MW is far above the usual for this field \(up to 10 W\); M is mega: for 60 mW type m \(milli\)/);
    await userEvent.clear(budget);
    await userEvent.type(budget, '60 mw');
    expect(description(budget)).toMatch(/= 60 mW/);
    expect(description(budget)).not.toMatch(/far above/);
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));
    await waitFor(() => expect(puts()).toHaveLength(1));
    expect((puts()[0].body as { payload: { powerBudgetW: number } }).payload.powerBudgetW).toBeCloseTo(0.06, 12);
  });
});
