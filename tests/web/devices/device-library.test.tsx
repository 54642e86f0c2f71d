// @vitest-environment jsdom
/**
 * The project page's device library: the cards listed a page at a time with their figures in
 * engineering notation, the upload, replace and remove controls only for the roles that may, the
 * file sent as multipart with the CSRF token (a replacement as PUT to the card), a removal asked
 * once more before the DELETE, and a refused file's problems shown with their line numbers.
 * Cards and files are invented.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import type { LibraryDevice } from '../../../web/src/lib/device-library';
import { DeviceLibrary } from '../../../web/src/features/devices/components/device-library';

const N150: LibraryDevice = {
  id: 1,
  projectId: 1,
  name: 'FH-N150',
  device: { family: 'npn', beta: 150, saturationCurrentA: 1.2e-15, earlyVoltageV: 86, model: { IS: 1.2e-15, BF: 150, VAF: 86, BR: 3.5 } },
  parameters: { IS: 1.2e-15, BF: 150, VAF: 86, BR: 3.5, ITF: 0.3 },
  notes: ['The engine does not model the card’s ITF; it is written into every netlist and simulated in the SPICE check.'],
  card: '.model FH-N150 NPN (IS=1.2f BF=150 VAF=86 BR=3.5 ITF=0.3)',
  line: 2,
  fileName: 'parts-bin.lib',
  checksum: 'c'.repeat(64),
  uploadedBy: { id: 3, displayName: 'Iris Vale' },
  uploadedAt: '2026-11-02T09:30:00.000Z',
  state: 'library',
  retiredAt: null,
  retiredBy: null,
  replacedById: null,
};

interface Sent {
  method: string;
  url: string;
  headers: Record<string, string>;
  body: unknown;
}

let sent: Sent[] = [];

/** The library answers `items` as one page (of `total`, default their count); a POST, PUT or DELETE answers `write` (status and body). */
function stubServer(items: LibraryDevice[], upload?: { status: number; body: unknown }, total = items.length) {
  sent = [];
  vi.stubGlobal('fetch', async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = String(input);
    const method = init?.method ?? 'GET';
    sent.push({ method, url, headers: (init?.headers ?? {}) as Record<string, string>, body: init?.body });
    const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
    if (url === '/api/auth/csrf') return json(200, { token: 'tok-1' });
    const { pathname, searchParams } = new URL(url, 'http://localhost');
    if (method === 'GET' && pathname === '/api/projects/1/devices') {
      return json(200, { items, total, page: Number(searchParams.get('page')), pageSize: Number(searchParams.get('pageSize')) });
    }
    if (method === 'POST' && url === '/api/projects/1/devices' && upload) return json(upload.status, upload.body);
    if ((method === 'PUT' || method === 'DELETE') && pathname.startsWith('/api/projects/1/devices/') && upload) {
      return upload.status === 204 ? new Response(null, { status: 204 }) : json(upload.status, upload.body);
    }
    return json(599, { error: `not mocked: ${method} ${url}` });
  });
}

function renderLibrary(canUpload: boolean) {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <QueryClientProvider client={queryClient}>
      <DeviceLibrary projectId={1} canUpload={canUpload} />
    </QueryClientProvider>,
  );
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('DeviceLibrary', () => {
  test('when the library holds a card, then its row shows the name, IS, BF, VAF in engineering notation, the file and the uploader', async () => {
    stubServer([N150]);
    renderLibrary(false);
    const table = await screen.findByRole('table', { name: 'Device models of this project' });
    const row = within(table).getAllByRole('row')[1];
    const cells = within(row).getAllByRole('cell').map((cell) => cell.textContent);
    expect(cells[0]).toContain('FH-N150');
    expect(cells[1]).toBe('1.2 fA');
    expect(cells[2]).toBe('150');
    expect(cells[3]).toBe('86 V');
    expect(cells[4]).toContain('parts-bin.lib');
    expect(cells[5]).toContain('Iris Vale');
    expect(screen.getByText(/estimates to confirm by simulation and bench measurement/)).toBeTruthy();
  });

  test('when the role may not upload, then there is no upload control', async () => {
    stubServer([N150]);
    renderLibrary(false);
    await screen.findByRole('table');
    expect(screen.queryByLabelText('Upload .model cards')).toBeNull();
  });

  test('when a file is chosen, then it goes as multipart in the field "file" with the CSRF token, and the added cards are named', async () => {
    stubServer([], { status: 201, body: { items: [N150] } });
    renderLibrary(true);
    const input = await screen.findByLabelText('Upload .model cards');
    const file = new File(['.model FH-N150 NPN (IS=1.2f BF=150 VAF=86 BR=3.5)\n'], 'parts-bin.lib', { type: 'text/plain' });

    await userEvent.upload(input, file);

    expect(await screen.findByText(/Added FH-N150 from parts-bin\.lib\./)).toBeTruthy();
    const post = sent.find((s) => s.method === 'POST');
    expect(post?.headers['X-CSRF-Token']).toBe('tok-1');
    expect(post?.headers['Content-Type']).toBeUndefined(); // the browser writes the multipart boundary
    expect(post?.body).toBeInstanceOf(FormData);
    expect(((post?.body as FormData).get('file') as File).name).toBe('parts-bin.lib');
    // The library is fetched again after the upload
    await waitFor(() => expect(sent.filter((s) => s.method === 'GET' && s.url.startsWith('/api/projects/1/devices?'))).toHaveLength(2));
  });

  test('when the server refuses the file, then each problem shows with its line number', async () => {
    stubServer([], {
      status: 400,
      body: {
        error: 'bad-parts.lib was not saved: fix the problems listed, then upload it again.',
        code: 'invalid-request',
        details: [
          { path: '/file', line: 3, message: 'FH-P150: PNP models are not supported; the library holds NPN transistor models only.' },
          { path: '/file', line: 7, message: 'FH-X: VAF is missing (the forward Early voltage; write VAF=0 for none); the engine needs IS, BF and VAF.' },
        ],
      },
    });
    renderLibrary(true);
    const input = await screen.findByLabelText('Upload .model cards');

    await userEvent.upload(input, new File(['.model FH-P150 PNP\n'], 'bad-parts.lib', { type: 'text/plain' }));

    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('bad-parts.lib was not saved: fix the problems listed, then upload it again.');
    const items = within(alert).getAllByRole('listitem').map((li) => li.textContent);
    expect(items).toEqual([
      'Line 3: FH-P150: PNP models are not supported; the library holds NPN transistor models only.',
      'Line 7: FH-X: VAF is missing (the forward Early voltage; write VAF=0 for none); the engine needs IS, BF and VAF.',
    ]);
  });

  test('when the library holds more cards than a page, then the first page is asked for by its size and Next asks for page 2', async () => {
    stubServer([N150], undefined, 45);
    renderLibrary(false);
    await screen.findByRole('table');
    expect(sent.find((s) => s.method === 'GET')?.url).toBe('/api/projects/1/devices?page=1&pageSize=20&state=library');
    expect(screen.getByText('1–20 of 45')).toBeTruthy();

    await userEvent.click(screen.getByRole('button', { name: /Next/ }));

    await waitFor(() => expect(sent.map((s) => s.url)).toContain('/api/projects/1/devices?page=2&pageSize=20&state=library'));
  });

  test('when a name is typed in the search field, then the library is asked for the cards containing it, from page 1', async () => {
    stubServer([N150]);
    renderLibrary(false);
    await screen.findByRole('table');

    await userEvent.type(screen.getByLabelText('Find a card by name'), 'n1');

    await waitFor(() => expect(sent.map((s) => s.url)).toContain('/api/projects/1/devices?page=1&pageSize=20&state=library&q=n1'));
  });

  test('when a card is replaced, then its new file goes as PUT multipart to that card with the CSRF token, and the page says the old text stays with its specs', async () => {
    stubServer([N150], { status: 200, body: { item: { ...N150, id: 9 }, replaced: { ...N150, state: 'replaced', replacedById: 9 } } });
    renderLibrary(true);
    const input = await screen.findByLabelText('Replace FH-N150 with a new card');

    await userEvent.upload(input, new File(['.model FH-N150 NPN (IS=1.3f BF=155 VAF=88)\n'], 'n150-remeasured.lib', { type: 'text/plain' }));

    expect(await screen.findByText(/Replaced FH-N150 with the card from n150-remeasured\.lib; specs filled from the old text keep it/)).toBeTruthy();
    const put = sent.find((s) => s.method === 'PUT');
    expect(put?.url).toBe('/api/projects/1/devices/1');
    expect(put?.headers['X-CSRF-Token']).toBe('tok-1');
    expect(((put?.body as FormData).get('file') as File).name).toBe('n150-remeasured.lib');
  });

  test('when Remove is clicked, then nothing is sent until it is confirmed; then DELETE goes to that card', async () => {
    stubServer([N150], { status: 204, body: null });
    renderLibrary(true);
    await userEvent.click(await screen.findByRole('button', { name: 'Remove FH-N150' }));
    expect(sent.some((s) => s.method === 'DELETE')).toBe(false);
    const confirm = screen.getByRole('group', { name: 'Remove FH-N150?' });
    expect(confirm.textContent).toContain('Specs filled from it keep its text.');

    await userEvent.click(within(confirm).getByRole('button', { name: 'Remove' }));

    expect(await screen.findByText(/Removed FH-N150 from the library/)).toBeTruthy();
    const removal = sent.find((s) => s.method === 'DELETE');
    expect(removal?.url).toBe('/api/projects/1/devices/1');
    expect(removal?.headers['X-CSRF-Token']).toBe('tok-1');
  });

  test('when the removed and replaced cards are shown, then each says how and when it left the library, and offers no change', async () => {
    stubServer([{ ...N150, state: 'removed', retiredAt: '2026-11-20T10:00:00.000Z', retiredBy: { id: 4, displayName: 'Tomas Reed' } }]);
    renderLibrary(true);
    await screen.findByRole('table');

    await userEvent.click(screen.getByRole('button', { name: 'Removed and replaced' }));

    await waitFor(() => expect(sent.map((s) => s.url)).toContain('/api/projects/1/devices?page=1&pageSize=20&state=former'));
    const table = await screen.findByRole('table', { name: 'Removed and replaced device models of this project' });
    expect(within(table).getAllByRole('row')[1].textContent).toContain('Removed, Tomas Reed');
    expect(within(table).queryByRole('button', { name: /Remove FH-N150/ })).toBeNull();
  });
});
