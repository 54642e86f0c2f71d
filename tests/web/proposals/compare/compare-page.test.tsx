// @vitest-environment jsdom
/**
 * The side-by-side page on a stubbed server: the state read from the address (a link reproduces
 * the view), each column's record, the warning when the sides come from different engine or rule
 * versions, the marks in symbols and words, choosing another option (the address follows), the
 * spec's changes between two versions, and the usual refusal when a proposal is not visible.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, configure, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRoutesStub, useLocation } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, test, vi } from 'vitest';
import schema from '#shared/schema/spec.schema.json';
import type { Proposal } from '#shared/api/proposals';
import { formatDb } from '#shared/units/figures';
import { Component, ErrorBoundary, loader } from '../../../../web/src/routes/compare';
import { topologyName } from '../../../../web/src/lib/topology-names';
import { proposalOf, strainBridge } from '../ranking/fixtures';

configure({ asyncUtilTimeout: 5000 });

vi.mock('../../../../web/src/features/proposals/components/ranking/plots/charts', () => ({
  RejectionChart: ({ plot }: { plot: { series: { name: string }[] } }) => <div data-testid="rejection-chart">{plot.series.map((s) => s.name).join(' | ')}</div>,
  HistogramChart: () => null,
  TemperatureChart: () => null,
}));

let proposals: Record<number, Proposal | 'refused'> = {};
let unmocked: string[] = [];

beforeEach(() => {
  unmocked = [];
  vi.stubGlobal('fetch', async (input: RequestInfo | URL) => {
    const url = new URL(String(input), 'http://longtail.test');
    const match = /^\/api\/proposals\/(\d+)$/.exec(url.pathname);
    const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
    if (match) {
      const found = proposals[Number(match[1])];
      if (found === 'refused' || !found) return json(404, { error: 'Proposal not found', code: 'not_found' });
      return json(200, found);
    }
    if (url.pathname === '/api/schema/spec') return json(200, schema);
    if (url.pathname === '/api/specs/2/diff') return json(200, { from: 1, to: 2, changes: [{ path: '/cmrr/marginDb', kind: 'changed', before: 3, after: 6 }] });
    unmocked.push(url.pathname);
    return json(599, { error: 'not mocked' });
  });
});

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  expect(unmocked, 'requests nobody mocked').toEqual([]);
});

function Address() {
  const location = useLocation();
  return <output data-testid="address">{location.pathname + location.search}</output>;
}

function renderAt(address: string) {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const Page = () => (
    <>
      <Component />
      <Address />
    </>
  );
  const Stub = createRoutesStub([{ path: '/compare', Component: Page, loader: loader(queryClient), ErrorBoundary, HydrateFallback: () => <p>Loading…</p> }]);
  render(
    <QueryClientProvider client={queryClient}>
      <Stub initialEntries={[address]} />
    </QueryClientProvider>,
  );
}

function twoVersions(): [Proposal, Proposal] {
  const a = proposalOf(strainBridge());
  const b = structuredClone(a);
  b.id = 8;
  b.specVersion = { ...b.specVersion, version: 2 };
  return [a, b];
}

describe('side-by-side page', () => {
  test('two options of one proposal from the address: each column’s record, figures in two columns, the differences marked in words', async () => {
    const proposal = proposalOf(strainBridge());
    proposals = { 7: proposal };
    const [first, second] = proposal.result.options.filter((o) => o.figures);
    renderAt(`/compare?a=7&b=7&tailA=${first.topology}&tailB=${second.topology}`);

    expect(await screen.findByRole('heading', { level: 1, name: `${topologyName(first.topology)} beside ${topologyName(second.topology)}` })).toBeTruthy();
    const sideA = screen.getByRole('region', { name: 'Side A' });
    expect(sideA.textContent).toContain(`Engine${proposal.engineVersion}`);
    expect(sideA.textContent).toContain(proposal.rulesetVersion);
    expect(sideA.textContent).toContain(`${proposal.specVersion.title}, version 1`);
    // The same engine and rule set on both sides: no warning
    expect(screen.queryByRole('note', { name: 'Read with care' })).toBeNull();

    const figures = screen.getByRole('table', { name: /Figures of side A and side B/ });
    const rejectionRow = figures.querySelector('tr[data-figure="cmrrAtFrequencyDb"]')!;
    expect(rejectionRow.textContent).toContain(formatDb(first.figures!.cmrrAtFrequencyDb).replace(' ', ''));
    expect(rejectionRow.textContent).toContain(formatDb(second.figures!.cmrrAtFrequencyDb).replace(' ', ''));
    expect(screen.getByTestId('difference-summary').textContent).toMatch(/by more than 1 % of the larger/);
    // Every marked row says what differs in words, not only in colour
    for (const marked of document.querySelectorAll('tr[data-marked]')) expect(marked.querySelector('[data-mark]')?.textContent).toMatch(/moved|changed|only on side/);
    expect(screen.getByTestId('rejection-chart').textContent).toBe(`A · ${topologyName(first.topology)}, #7 v1 | B · ${topologyName(second.topology)}, #7 v1`);
  });

  test('choosing another option for side B puts it in the address', async () => {
    const proposal = proposalOf(strainBridge());
    proposals = { 7: proposal };
    const [first, second, third] = proposal.result.options;
    renderAt(`/compare?a=7&b=7&tailA=${first.topology}&tailB=${second.topology}`);
    const sideB = await screen.findByRole('region', { name: 'Side B' });
    await userEvent.selectOptions(within(sideB).getByRole('combobox', { name: 'Option' }), third.topology);
    await waitFor(() => expect(screen.getByTestId('address').textContent).toBe(`/compare?a=7&b=7&tailA=${first.topology}&tailB=${third.topology}`));
    expect(await screen.findByRole('heading', { level: 1, name: `${topologyName(first.topology)} beside ${topologyName(third.topology)}` })).toBeTruthy();
  });

  test('two spec versions ranked by different engine and rule-set versions: said plainly above the table, and the spec’s changes field by field with units', async () => {
    const [a, b] = twoVersions();
    b.engineVersion = '9.9.9';
    b.rulesetVersion = 'e'.repeat(64);
    proposals = { 7: a, 8: b };
    renderAt('/compare?a=7&b=8');

    const note = await screen.findByRole('note', { name: 'Read with care' });
    expect(note.textContent).toContain(`different engine versions (A: ${a.engineVersion}, B: 9.9.9)`);
    expect(note.textContent).toContain('different rule sets');
    expect(note.textContent).toContain('A: version 1, B: version 2');
    const changes = await screen.findByRole('region', { name: 'What the spec changed' });
    expect(changes.textContent).toContain('1 field differs between version 1 and version 2.');
    expect(changes.textContent).toMatch(/3 dB/);
    expect(changes.textContent).toMatch(/6 dB/);
  });

  test('a proposal the reader may not see: the usual refusal, nothing of the other side', async () => {
    proposals = { 7: proposalOf(strainBridge()), 9: 'refused' };
    renderAt('/compare?a=7&b=9');
    expect(await screen.findByRole('alert')).toBeTruthy();
    expect(screen.getByRole('heading', { level: 1 }).textContent).toBe('Not found');
    expect(screen.queryByRole('region', { name: 'Side A' })).toBeNull();
  });

  test('an address that names no comparison says how to make one', async () => {
    proposals = {};
    renderAt('/compare');
    expect(await screen.findByText('Nothing to compare yet')).toBeTruthy();
  });
});
