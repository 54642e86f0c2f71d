// @vitest-environment jsdom
import { cleanup, render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import type { TopologyId } from '#shared/engine/types';
import { OptionsTable } from '../../../../web/src/features/proposals/components/ranking/options-table';
import { formatQuantity } from '#shared/units/format-quantity';
import type { RecommendOption } from '#shared/engine/recommend';
import { blockingShortCount, optionRows, specTargets } from '../../../../web/src/features/proposals/lib/option-rows';
import { topologyName } from '../../../../web/src/lib/topology-names';
import { specOf, strainBridge, studioLine } from './fixtures';

afterEach(cleanup);

function renderTable(result = strainBridge(), selected: TopologyId = 'degenerated-mirror') {
  const onSelect = vi.fn();
  render(<OptionsTable rows={optionRows(result)} targets={specTargets(result)} selected={selected} onSelect={onSelect} />);
  return { onSelect, user: userEvent.setup() };
}

/** Topologies in the order the table shows them. */
const shown = () => [...document.querySelectorAll<HTMLButtonElement>('tbody button[data-option]')].map((b) => b.dataset.option);
const sortButton = (name: RegExp) => screen.getByRole('button', { name });
const headerOf = (name: RegExp) => sortButton(name).closest('th')!;

const OPTIONS = strainBridge().options;
/** The fixture's topologies ordered by one figure, largest first. */
const largestFirst = (figure: (o: RecommendOption) => number) => [...OPTIONS].sort((a, b) => figure(b) - figure(a)).map((o) => o.topology);
/** The header of the rejection column names the spec frequency. */
const atFrequency = (spec: 'strain' | 'studio') => new RegExp(`^${formatQuantity(specOf(spec).cmrr.atFrequencyHz, 'Hz').replace('.', '\\.')}`);

describe('OptionsTable sorting', () => {
  test('starts in ranking order', () => {
    renderTable();
    expect(shown()).toEqual([...OPTIONS].sort((a, b) => a.rank - b.rank).map((o) => o.topology));
    expect(shown()).toHaveLength(6);
    expect(headerOf(/^#/).getAttribute('aria-sort')).toBe('ascending');
  });

  test('by tail current: largest first, then ascending', async () => {
    const { user } = renderTable();
    await user.click(sortButton(/^Tail current/));
    const byCurrent = largestFirst((o) => o.predicted!.tailCurrentA);
    expect(shown()).toEqual(byCurrent);
    expect(headerOf(/^Tail current/).getAttribute('aria-sort')).toBe('descending');
    await user.click(sortButton(/^Tail current/));
    expect(shown()).toEqual([...byCurrent].reverse());
    expect(headerOf(/^Tail current/).getAttribute('aria-sort')).toBe('ascending');
  });

  test('by rejection at the spec frequency (worst corner), best first', async () => {
    const { user } = renderTable();
    const byRejection = largestFirst((o) => o.figures!.cmrrAtFrequencyDb);
    await user.click(sortButton(atFrequency('strain')));
    expect(shown()).toEqual(byRejection);
    await user.click(sortButton(atFrequency('strain')));
    expect(shown()).toEqual([...byRejection].reverse());
  });

  test('unsolved options sort last in both directions', async () => {
    const result = strainBridge();
    result.options[1] = { ...result.options[1], predicted: null, figures: null, passes: false };
    const { user } = renderTable(result);
    await user.click(sortButton(/^Tail current/));
    expect(shown().at(-1)).toBe('wilson');
    await user.click(sortButton(/^Tail current/));
    expect(shown().at(-1)).toBe('wilson');
  });

  test.each([/^Tail \|Z\|/, /^DC/, /^Mismatch/, /^Yield/, /^Gain/, /^Power/, /^ICM low/, /^ICM high/, /^Swing/, /^Verdict/])('every numeric column sorts: %s', async (name) => {
    const { user } = renderTable();
    await user.click(sortButton(name));
    expect(['ascending', 'descending']).toContain(headerOf(name).getAttribute('aria-sort'));
    expect(shown()).toHaveLength(6);
  });

  test('by verdict: passing first, then by how many blocking checks fall short', async () => {
    const { user } = renderTable();
    await user.click(sortButton(/^Verdict/));
    const passing = OPTIONS.filter((o) => o.passes);
    const failing = OPTIONS.filter((o) => !o.passes);
    // The fixture has both kinds, and failing options short of different numbers of checks.
    expect(passing.length).toBeGreaterThan(0);
    expect(new Set(failing.map(blockingShortCount)).size).toBeGreaterThan(1);
    expect(new Set(shown().slice(0, passing.length))).toEqual(new Set(passing.map((o) => o.topology)));
    expect(shown().slice(passing.length).map((t) => blockingShortCount(OPTIONS.find((o) => o.topology === t)!))).toEqual(failing.map(blockingShortCount).sort((a, b) => a - b));
  });
});

describe('OptionsTable filtering', () => {
  test('text filter on the topology name', async () => {
    const { user } = renderTable();
    await user.type(screen.getByRole('searchbox', { name: 'Filter tails' }), 'mirror');
    expect(shown()).toEqual(OPTIONS.filter((o) => topologyName(o.topology).includes('mirror')).map((o) => o.topology));
    expect(screen.getByRole('status').textContent).toBe('4 of 6 options shown');
  });

  test('passing only', async () => {
    const { user } = renderTable();
    await user.click(screen.getByRole('checkbox', { name: 'Passing only' }));
    expect(shown()).toEqual(OPTIONS.filter((o) => o.passes).map((o) => o.topology));
  });

  test('both, and an empty result says so', async () => {
    expect(OPTIONS.find((o) => o.topology === 'simple-mirror')!.passes).toBe(false);
    const { user } = renderTable();
    await user.click(screen.getByRole('checkbox', { name: 'Passing only' }));
    await user.type(screen.getByRole('searchbox', { name: 'Filter tails' }), 'simple');
    expect(shown()).toEqual([]);
    expect(screen.getByText('No option matches the filter.')).toBeTruthy();
  });
});

describe('OptionsTable rows', () => {
  test('a click on a row selects its option', async () => {
    const { user, onSelect } = renderTable();
    const widlarRow = screen.getByRole('button', { name: 'Widlar source' }).closest('tr')!;
    await user.click(within(widlarRow).getAllByRole('cell').at(-1)!);
    expect(onSelect).toHaveBeenLastCalledWith('widlar');
  });

  test('the selected option is pressed; arrow keys move the selection', async () => {
    const { user, onSelect } = renderTable();
    const selected = screen.getByRole('button', { name: 'Degenerated mirror' });
    expect(selected.getAttribute('aria-pressed')).toBe('true');
    const ranked = [...OPTIONS].sort((a, b) => a.rank - b.rank).map((o) => o.topology);
    const next = ranked[ranked.indexOf('degenerated-mirror') + 1];
    selected.focus();
    await user.keyboard('{ArrowDown}');
    expect(onSelect).toHaveBeenLastCalledWith(next);
    expect(document.activeElement).toBe(screen.getByRole('button', { name: topologyName(next) }));
    await user.keyboard('{ArrowUp}');
    expect(onSelect).toHaveBeenLastCalledWith('degenerated-mirror');
  });

  test('Enter on a name selects it', async () => {
    const { user, onSelect } = renderTable();
    screen.getByRole('button', { name: 'Resistor' }).focus();
    await user.keyboard('{Enter}');
    expect(onSelect).toHaveBeenLastCalledWith('resistor');
  });

  test('figures short of a blocking check carry words, not colour alone', () => {
    renderTable();
    const resistorRow = screen.getByRole('button', { name: 'Resistor' }).closest('tr')!;
    const resistor = optionRows(strainBridge()).find((r) => r.topology === 'resistor')!;
    const shortFigures = Object.values(resistor.standing).filter((s) => s === 'short').length;
    expect(shortFigures).toBeGreaterThan(0);
    expect(within(resistorRow).getAllByText('(short of its check)', { exact: false }).length).toBe(shortFigures);
    expect(within(resistorRow).getByText(`Short · ${resistor.blockingShortCount}`, { exact: false })).toBeTruthy();
  });

  test('mismatch and yield columns only for a differential output', () => {
    renderTable();
    expect(sortButton(/^Mismatch/)).toBeTruthy();
    cleanup();
    renderTable(studioLine(), 'cascode');
    expect(screen.queryByRole('button', { name: /^Mismatch/ })).toBeNull();
    expect(screen.queryByRole('button', { name: /^Yield/ })).toBeNull();
    expect(sortButton(atFrequency('studio'))).toBeTruthy();
  });
});
