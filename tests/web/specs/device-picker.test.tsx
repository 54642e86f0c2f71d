// @vitest-environment jsdom
/**
 * The spec form's device-library picker: choosing a card fills IS, BF and VAF and records the
 * card (name and file checksum) in the saved spec; editing one of those values afterwards drops
 * the record; without a project there is no picker. Cards are invented.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import specSchema from '../../../shared/schema/spec.schema.json';
import type { LibraryDevice } from '../../../web/src/features/devices/api/device-queries';
import { saveSpecVersion } from '../../../web/src/features/specs/api/spec-queries';
import { SpecForm, type SpecDraft } from '../../../web/src/features/specs/components/spec-form';
import { mockFetch } from './fetch-mock';

const SAVED: SpecDraft = { title: 'Bridge input', device: { beta: 100, earlyVoltageV: 100 }, supply: { positiveV: 12, negativeV: -12 }, gain: { target: 100 }, cmrr: { minDb: 80 } };

const card = (id: number, name: string, beta: number, saturationCurrentA: number, earlyVoltageV: number): LibraryDevice => ({
  id,
  projectId: 1,
  name,
  device: { family: 'npn', beta, saturationCurrentA, earlyVoltageV },
  parameters: { IS: saturationCurrentA, BF: beta, VAF: earlyVoltageV },
  notes: [],
  card: `.model ${name} NPN (IS=${saturationCurrentA} BF=${beta} VAF=${earlyVoltageV})`,
  line: id,
  fileName: 'parts-bin.lib',
  checksum: String(id).repeat(64),
  uploadedBy: { id: 3, displayName: 'Iris Vale' },
  uploadedAt: '2026-11-02T09:30:00.000Z',
});
const LIBRARY = [card(1, 'FH-N150', 150, 1.2e-15, 86), card(2, 'FH-N320', 320, 2.5e-14, 120)];

let network: ReturnType<typeof mockFetch> | undefined;
afterEach(() => {
  cleanup();
  network?.assertNoUnexpectedRequests();
  vi.unstubAllGlobals();
});

function renderForm(projectId: number | undefined) {
  network = mockFetch({
    'GET /api/schema/spec': { status: 200, body: specSchema },
    'GET /api/projects/1/devices': { status: 200, body: { items: LIBRARY } },
    'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
    'PUT /api/specs/7': { status: 200, body: {} },
  });
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const onSave = vi.fn((draft: SpecDraft) => saveSpecVersion(7, { title: String(draft.title ?? ''), payload: draft }));
  render(
    <QueryClientProvider client={queryClient}>
      <SpecForm initial={SAVED} onSave={onSave} saveLabel="Save as new version" projectId={projectId} />
    </QueryClientProvider>,
  );
  return { saved: () => network!.requests.filter((r) => r.key === 'PUT /api/specs/7').map((r) => (r.body as { payload: Record<string, any> }).payload) };
}

describe('the device picker of the spec form', () => {
  test('when a card is chosen, then IS, BF and VAF take its values and the saved spec records the card', async () => {
    const { saved } = renderForm(1);
    const picker = await screen.findByLabelText('Fill from the device library');
    await waitFor(() => expect(screen.getAllByRole('option', { name: /FH-N320/ })).toHaveLength(1));

    await userEvent.selectOptions(picker, screen.getByRole('option', { name: /FH-N320/ }));

    await waitFor(() => expect((screen.getByLabelText(/^Current gain/) as HTMLInputElement).value).toBe('320'));
    expect(screen.getByText(/come from card FH-N320 of parts-bin\.lib/)).toBeTruthy();
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));
    await waitFor(() => expect(saved()).toHaveLength(1));
    expect(saved()[0].deviceModel).toEqual({ name: 'FH-N320', checksum: '2'.repeat(64) });
    expect(saved()[0].device).toMatchObject({ beta: 320, saturationCurrentA: 2.5e-14, earlyVoltageV: 120 });
  });

  test('when a chosen card’s BF is edited, then the record of the card is dropped and the typed value kept', async () => {
    const { saved } = renderForm(1);
    const picker = await screen.findByLabelText('Fill from the device library');
    await waitFor(() => expect(screen.getAllByRole('option', { name: /FH-N150/ })).toHaveLength(1));
    await userEvent.selectOptions(picker, screen.getByRole('option', { name: /FH-N150/ }));
    const beta = screen.getByLabelText(/^Current gain/) as HTMLInputElement;
    await waitFor(() => expect(beta.value).toBe('150'));

    await userEvent.clear(beta);
    await userEvent.type(beta, '160');

    expect((picker as HTMLSelectElement).value).toBe('');
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));
    await waitFor(() => expect(saved()).toHaveLength(1));
    expect(saved()[0].deviceModel).toBeUndefined();
    expect(saved()[0].device).toMatchObject({ beta: 160, saturationCurrentA: 1.2e-15, earlyVoltageV: 86 });
  });

  test('when the form has no project, then there is no picker and no library request', async () => {
    renderForm(undefined);
    await screen.findByLabelText(/^Current gain/);
    expect(screen.queryByLabelText('Fill from the device library')).toBeNull();
    expect(network!.requests.map((r) => r.key)).not.toContain('GET /api/projects/1/devices');
  });
});
