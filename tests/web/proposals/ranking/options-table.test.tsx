// @vitest-environment jsdom
import { cleanup, render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import type { TopologyId } from '../../../../shared/engine/types';
import { OptionsTable } from '../../../../web/src/features/proposals/components/ranking/options-table';
import { optionRows, specTargets } from '../../../../web/src/features/proposals/lib/option-rows';
import { strainBridge, studioLine } from './fixtures';

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

describe('OptionsTable sorting', () => {
  test('starts in ranking order', () => {
    renderTable();
    expect(shown()).toEqual(['cascode', 'wilson', 'degenerated-mirror', 'widlar', 'simple-mirror', 'resistor']);
    expect(headerOf(/^#/).getAttribute('aria-sort')).toBe('ascending');
  });

  test('by tail current: largest first, then ascending', async () => {
    const { user } = renderTable();
    await user.click(sortButton(/^Tail current/));
    expect(shown()).toEqual(['resistor', 'wilson', 'degenerated-mirror', 'cascode', 'simple-mirror', 'widlar']);
    expect(headerOf(/^Tail current/).getAttribute('aria-sort')).toBe('descending');
    await user.click(sortButton(/^Tail current/));
    expect(shown()).toEqual(['widlar', 'simple-mirror', 'cascode', 'degenerated-mirror', 'wilson', 'resistor']);
    expect(headerOf(/^Tail current/).getAttribute('aria-sort')).toBe('ascending');
  });

  test('by rejection at the spec frequency (worst corner), best first', async () => {
    const { user } = renderTable();
    await user.click(sortButton(/^2\.5 kHz/));
    expect(shown()).toEqual(['cascode', 'wilson', 'degenerated-mirror', 'widlar', 'simple-mirror', 'resistor']);
    await user.click(sortButton(/^2\.5 kHz/));
    expect(shown()).toEqual(['resistor', 'simple-mirror', 'widlar', 'degenerated-mirror', 'wilson', 'cascode']);
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
    expect(shown().slice(3)).toEqual(['widlar', 'simple-mirror', 'resistor']);
  });
});

describe('OptionsTable filtering', () => {
  test('text filter on the topology name', async () => {
    const { user } = renderTable();
    await user.type(screen.getByRole('searchbox', { name: 'Filter tails' }), 'mirror');
    expect(shown()).toEqual(['cascode', 'wilson', 'degenerated-mirror', 'simple-mirror']);
    expect(screen.getByRole('status').textContent).toBe('4 of 6 options shown');
  });

  test('passing only', async () => {
    const { user } = renderTable();
    await user.click(screen.getByRole('checkbox', { name: 'Passing only' }));
    expect(shown()).toEqual(['cascode', 'wilson', 'degenerated-mirror']);
  });

  test('both, and an empty result says so', async () => {
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
    await user.click(within(widlarRow).getByText('322'));
    expect(onSelect).toHaveBeenLastCalledWith('widlar');
  });

  test('the selected option is pressed; arrow keys move the selection', async () => {
    const { user, onSelect } = renderTable();
    const selected = screen.getByRole('button', { name: 'Degenerated mirror' });
    expect(selected.getAttribute('aria-pressed')).toBe('true');
    selected.focus();
    await user.keyboard('{ArrowDown}');
    expect(onSelect).toHaveBeenLastCalledWith('widlar');
    expect(document.activeElement).toBe(screen.getByRole('button', { name: 'Widlar source' }));
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
    expect(within(resistorRow).getAllByText('(short of its check)', { exact: false }).length).toBe(3);
    expect(within(resistorRow).getByText(/Short · 4/)).toBeTruthy();
  });

  test('mismatch and yield columns only for a differential output', () => {
    renderTable();
    expect(sortButton(/^Mismatch/)).toBeTruthy();
    cleanup();
    renderTable(studioLine(), 'cascode');
    expect(screen.queryByRole('button', { name: /^Mismatch/ })).toBeNull();
    expect(screen.queryByRole('button', { name: /^Yield/ })).toBeNull();
    expect(sortButton(/^15 kHz/)).toBeTruthy();
  });
});
