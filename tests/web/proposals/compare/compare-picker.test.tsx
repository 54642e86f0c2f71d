// @vitest-environment jsdom
/**
 * The ways into the side-by-side view from a proposal: two of its options, or one of them beside
 * another proposal of the project (the same spec's rankings listed first, an earlier version put on
 * side A). The server is a fetch stub with invented proposals.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, configure, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, test, vi } from 'vitest';
import { ComparePicker } from '../../../../web/src/features/proposals/components/compare/compare-picker';
import { topologyName } from '../../../../web/src/lib/topology-names';
import { proposalOf, strainBridge } from '../ranking/fixtures';

configure({ asyncUtilTimeout: 5000 });

let asked: string[] = [];
beforeEach(() => {
  asked = [];
  vi.stubGlobal('fetch', async (input: RequestInfo | URL) => {
    asked.push(String(input));
    const summary = (id: number, specId: number, specVersionNumber: number) => ({ id, specId, specVersionNumber, specTitle: `Spec ${specId}`, projectId: 1, status: 'ranked' });
    // newest first: another spec's proposal, this one (#7, spec 2 version 2), an earlier version of this spec
    const body = { items: [summary(11, 5, 1), summary(7, 2, 2), summary(6, 2, 1)], total: 3, page: 1, pageSize: 100 };
    return new Response(JSON.stringify(body), { status: 200, headers: { 'Content-Type': 'application/json' } });
  });
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function renderPicker() {
  const proposal = proposalOf(strainBridge());
  proposal.specVersion = { ...proposal.specVersion, version: 2 };
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <QueryClientProvider client={client}>
      <MemoryRouter>
        <ComparePicker proposal={proposal} selected={proposal.result.options[0].topology} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
  return proposal;
}

describe('side-by-side choices on a proposal', () => {
  test('two options of the ranking: the address names the proposal twice and both options', async () => {
    const proposal = renderPicker();
    const [first, , third] = proposal.result.options;
    await userEvent.selectOptions(screen.getByRole('combobox', { name: 'with' }), topologyName(third.topology));
    expect(screen.getByRole('link', { name: 'Set these two options side by side' }).getAttribute('href')).toBe(`/compare?a=7&b=7&tailA=${first.topology}&tailB=${third.topology}`);
  });

  test('another proposal: the project’s newest asked for once, this spec’s others first, an earlier version on side A with the same option', async () => {
    const proposal = renderPicker();
    const tail = proposal.result.options[0].topology;
    const list = await screen.findByRole('combobox', { name: /with another proposal of this project/ });
    expect([...list.querySelectorAll('option')].map((o) => o.value)).toEqual(['6', '11']);
    expect(screen.getByRole('link', { name: 'Set it beside this one' }).getAttribute('href')).toBe(`/compare?a=6&b=7&tailA=${tail}&tailB=${tail}`);
    await userEvent.selectOptions(list, '11');
    // another spec: this proposal stays on side A
    expect(screen.getByRole('link', { name: 'Set it beside this one' }).getAttribute('href')).toBe(`/compare?a=7&b=11&tailA=${tail}&tailB=${tail}`);
    expect(asked).toEqual(['/api/projects/1/proposals?page=1&pageSize=100']);
  });
});
