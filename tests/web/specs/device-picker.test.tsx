// @vitest-environment jsdom
/**
 * The spec form's device-library picker: choosing a card fills IS, BF and VAF and records the
 * card (name and file checksum) in the saved spec; editing one of those values afterwards drops
 * the record; without a project there is no picker. The picker asks for one page of the library
 * (100 cards) and, past that, offers a search by name; a spec whose recorded card was since
 * replaced or removed says so and shows the text it was filled from. Cards are invented.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import specSchema from '#shared/schema/spec.schema.json';
import type { LibraryDevice } from '../../../web/src/lib/device-library';
import { saveSpecVersion } from '../../../web/src/features/specs/api/spec-queries';
import { SpecForm, type SpecDraft } from '../../../web/src/features/specs/components/spec-form';
import { mockFetch, type MockAnswer } from './fetch-mock';

const SAVED: SpecDraft = { title: 'Bridge input', device: { beta: 100, earlyVoltageV: 100 }, supply: { positiveV: 12, negativeV: -12 }, gain: { target: 100 }, cmrr: { minDb: 80 } };

const card = (id: number, name: string, beta: number, saturationCurrentA: number, earlyVoltageV: number): LibraryDevice => ({
  id,
  projectId: 1,
  name,
  device: { family: 'npn', beta, saturationCurrentA, earlyVoltageV, model: { IS: saturationCurrentA, BF: beta, VAF: earlyVoltageV } },
  parameters: { IS: saturationCurrentA, BF: beta, VAF: earlyVoltageV },
  notes: [],
  card: `.model ${name} NPN (IS=${saturationCurrentA} BF=${beta} VAF=${earlyVoltageV})`,
  line: id,
  fileName: 'parts-bin.lib',
  checksum: String(id).repeat(64),
  uploadedBy: { id: 3, displayName: 'Iris Vale' },
  uploadedAt: '2026-11-02T09:30:00.000Z',
  state: 'library',
  retiredAt: null,
  retiredBy: null,
  replacedById: null,
});
const LIBRARY = [card(1, 'FH-N150', 150, 1.2e-15, 86), card(2, 'FH-N320', 320, 2.5e-14, 120)];

let network: ReturnType<typeof mockFetch> | undefined;
afterEach(() => {
  cleanup();
  network?.assertNoUnexpectedRequests();
  vi.unstubAllGlobals();
});

const FIRST_PAGE = 'GET /api/projects/1/devices?page=1&pageSize=100&state=library';

function renderForm(projectId: number | undefined, initial: SpecDraft = SAVED, more: Record<string, MockAnswer> = {}, editable = true) {
  network = mockFetch({
    'GET /api/schema/spec': { status: 200, body: specSchema },
    [FIRST_PAGE]: { status: 200, body: { items: LIBRARY, total: LIBRARY.length, page: 1, pageSize: 100 } },
    'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
    'PUT /api/specs/7': { status: 200, body: {} },
    ...more,
  });
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const onSave = vi.fn((draft: SpecDraft) => saveSpecVersion(7, { title: String(draft.title ?? ''), payload: draft }));
  render(
    <QueryClientProvider client={queryClient}>
      <SpecForm initial={initial} onSave={editable ? onSave : undefined} saveLabel="Save as new version" projectId={projectId} />
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
    expect(network!.requests.map((r) => r.key).filter((key) => key.includes('/devices'))).toEqual([]);
  });

  test('when the library holds more cards than one page, then a search by name appears and asks the library for the cards containing it', async () => {
    renderForm(1, SAVED, {
      [FIRST_PAGE]: { status: 200, body: { items: LIBRARY, total: 340, page: 1, pageSize: 100 } },
      'GET /api/projects/1/devices?page=1&pageSize=100&state=library&q=N3': { status: 200, body: { items: [LIBRARY[1]], total: 1, page: 1, pageSize: 100 } },
    });
    await screen.findByLabelText('Fill from the device library');
    const search = await screen.findByLabelText('Find a library card by name', {}, { timeout: 3000 });
    expect(screen.getByText(/The first 100 of 340 cards by name/)).toBeTruthy();

    await userEvent.type(search, 'N3');

    await waitFor(() => expect(screen.queryAllByRole('option', { name: /FH-N150/ })).toHaveLength(0));
    expect(screen.getAllByRole('option', { name: /FH-N320/ })).toHaveLength(1);
  });

  test('when the spec was filled from a card since replaced, then the picker says so, names the current card, and shows the text the spec was filled from', async () => {
    const old = { ...card(5, 'FH-K200', 200, 4e-15, 90), checksum: 'e'.repeat(64), fileName: 'first-issue.lib', state: 'replaced' as const, retiredAt: '2026-11-20T10:00:00.000Z', retiredBy: { id: 4, displayName: 'Tomas Reed' }, replacedById: 6 };
    const current = { ...card(6, 'FH-K200', 185, 4.4e-15, 95), fileName: 'remeasured.lib' };
    const filled: SpecDraft = { ...SAVED, device: { beta: 200, saturationCurrentA: 4e-15, earlyVoltageV: 90 }, deviceModel: { name: 'FH-K200', checksum: 'e'.repeat(64) } };
    renderForm(1, filled, {
      [FIRST_PAGE]: { status: 200, body: { items: [...LIBRARY, current], total: 3, page: 1, pageSize: 100 } },
      [`GET /api/projects/1/devices/recorded?name=FH-K200&checksum=${'e'.repeat(64)}`]: { status: 200, body: { recorded: old, current } },
    });

    await screen.findByLabelText('Fill from the device library');
    await waitFor(() => expect(screen.getByRole('option', { name: 'FH-K200 (replaced in the library)' })).toBeTruthy(), { timeout: 3000 });
    expect(await screen.findByText(/Filled from FH-K200 of first-issue\.lib .* since replaced by a new text on 20 Nov 2026 by Tomas Reed\. The library's FH-K200 today is from remeasured\.lib/)).toBeTruthy();
    expect(screen.getByText('.model FH-K200 NPN (IS=4e-15 BF=200 VAF=90)')).toBeTruthy();
    // The spec keeps its values and its record until someone chooses otherwise
    expect((screen.getByLabelText(/^Current gain/) as HTMLInputElement).value).toBe('200');
  });

  test('when a read-only viewer opens a spec whose card was since removed, then only that card is looked up and the spec says it was removed, by whom and when', async () => {
    const removed = { ...card(8, 'FH-K90', 90, 7e-15, 40), checksum: 'd'.repeat(64), state: 'removed' as const, retiredAt: '2026-11-21T10:00:00.000Z', retiredBy: { id: 2, displayName: 'Odile Marchetti' } };
    const filled: SpecDraft = { ...SAVED, device: { beta: 90, saturationCurrentA: 7e-15, earlyVoltageV: 40 }, deviceModel: { name: 'FH-K90', checksum: 'd'.repeat(64) } };
    renderForm(1, filled, { [`GET /api/projects/1/devices/recorded?name=FH-K90&checksum=${'d'.repeat(64)}`]: { status: 200, body: { recorded: removed, current: null } } }, false);

    expect(await screen.findByText(/since removed from the library on 21 Nov 2026 by Odile Marchetti\./, {}, { timeout: 3000 })).toBeTruthy();
    expect(screen.queryByLabelText('Fill from the device library')).toBeNull();
    expect(network!.requests.map((r) => r.key).filter((key) => key.includes('/devices'))).toEqual([`GET /api/projects/1/devices/recorded?name=FH-K90&checksum=${'d'.repeat(64)}`]);
  });
});
