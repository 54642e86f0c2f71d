// @vitest-environment jsdom
/**
 * The ranking table's columns for the spec's optional targets (noise, bias current, offset, its
 * drift, bandwidth, slew rate, supply rejection per rail, linear range): one per target the spec
 * sets, none for those it leaves out, each showing the option's worst-corner figure with its unit
 * and marked ✕ where the target's blocking check falls short; the printed report shows the same
 * columns. Limits are read from the fixture's spec file, figures from the engine's fixture.
 */
import { cleanup, render, within } from '@testing-library/react';
import { afterEach, describe, expect, test } from 'vitest';
import { formatQuantity } from '#shared/units/format-quantity';
import { OptionsTable } from '../../../../web/src/features/proposals/components/ranking/options-table';
import { RankedOptions } from '../../../../web/src/features/proposals/components/report/ranked-options';
import { optionRows, specTargets } from '../../../../web/src/features/proposals/lib/option-rows';
import { topologyName } from '../../../../web/src/lib/topology-names';
import { hydrophonePreamp, proposalOf, specOf, strainBridge, studioLine } from './fixtures';

afterEach(cleanup);

const clean = (text: string | null) => (text ?? '').replace(/[▲▼↕]/g, '').replace(/\u00a0/g, ' ').trim();
/** Text without spaces: the cell sets the unit in its own span (no space in textContent). */
const bare = (text: string | null) => clean(text).replace(/\s/g, '');
const headings = (table: HTMLTableElement) => [...table.querySelectorAll('thead tr:last-child th')].map((th) => clean(th.textContent));

function pageTable(result: ReturnType<typeof strainBridge>) {
  return render(<OptionsTable rows={optionRows(result)} targets={specTargets(result)} selected={null} onSelect={() => undefined} />).container.querySelector('table')!;
}

/** The cell of one column (by heading start) in one option's row. */
function cellOf(table: HTMLTableElement, topology: string, heading: RegExp): HTMLElement {
  const index = [...table.querySelectorAll('thead tr:last-child th, thead tr:last-child td')].findIndex((th) => heading.test(clean(th.textContent)));
  expect(index).toBeGreaterThanOrEqual(0);
  const row = [...table.querySelectorAll('tbody tr')].find((tr) => within(tr as HTMLElement).getByRole('rowheader').textContent!.includes(topologyName(topology as never)))!;
  return row.children[index] as HTMLElement;
}

const TARGET_HEADINGS = /^(Noise|Bias current|Offset|Offset drift|Bandwidth|Slew rate|PSRR \+|PSRR −|Linear range)/;

describe('the trade-off target columns', () => {
  test.each([
    ['a differential spec with no optional target', strainBridge],
    ['a single-ended spec with no optional target', studioLine],
  ])('%s: no target column and no target group', (_name, fixture) => {
    const table = pageTable(fixture());
    expect(headings(table).filter((h) => TARGET_HEADINGS.test(h))).toEqual([]);
    expect(table.textContent).not.toContain('Spec targets');
  });

  test('a spec with noise, bias-current, slew-rate and offset targets: exactly those four columns, each with the spec’s limit', () => {
    const spec = specOf('hydrophone');
    const table = pageTable(hydrophonePreamp());
    const shown = headings(table).filter((h) => TARGET_HEADINGS.test(h));
    expect(shown).toEqual([
      `Noise≤ ${formatQuantity(spec.noise!.maxVPerRtHz!, 'V/√Hz')} at ${formatQuantity(spec.noise!.atFrequencyHz!, 'Hz')}`,
      `Bias current≤ ${formatQuantity(spec.inputBiasCurrentMaxA!, 'A')}`,
      `Offset3 σ, ≤ ${formatQuantity(spec.offset!.maxV!, 'V')}`,
      `Slew rate≥ ${formatQuantity(spec.slewRateMinVPerS!, 'V/s')}`,
    ]);
    expect(table.textContent).toContain('Spec targets, worst corner');
  });

  test('each cell is the worst-corner figure with its unit, marked ✕ where its blocking check falls short and plain where it holds', () => {
    const result = hydrophonePreamp();
    const table = pageTable(result);
    for (const option of result.options) {
      const f = option.figures!;
      const failed = (rule: string) => option.checks.some((c) => c.rule === rule && !c.passed);
      const noise = cellOf(table, option.topology, /^Noise/);
      expect(bare(noise.textContent)).toContain(bare(formatQuantity(f.noiseVPerRtHz!, 'V/√Hz')));
      expect(noise.textContent!.startsWith('✕')).toBe(failed('input-noise'));
      expect(noise.textContent!.includes('short of its check')).toBe(failed('input-noise'));
      const bias = cellOf(table, option.topology, /^Bias current/);
      expect(bare(bias.textContent)).toContain(bare(formatQuantity(f.inputBiasCurrentWorstA!, 'A')));
      expect(bias.textContent!.startsWith('✕')).toBe(failed('input-bias-current'));
      const slew = cellOf(table, option.topology, /^Slew rate/);
      expect(bare(slew.textContent)).toBe(bare(formatQuantity(f.slewRateWorstVPerS!, 'V/s')));
    }
    // the fixture's window is too narrow for noise and bias current at once: the noise falls short on every option
    expect(result.options.every((o) => o.checks.some((c) => c.rule === 'input-noise' && !c.passed))).toBe(true);
  });

  test('the printed report shows the same target columns and figures as the page', () => {
    const result = hydrophonePreamp();
    const page = pageTable(result);
    const report = render(<RankedOptions proposal={proposalOf(result, 'hydrophone')} decided={null} />).container.querySelector('table')!;
    expect(headings(report).filter((h) => TARGET_HEADINGS.test(h))).toEqual(headings(page).filter((h) => TARGET_HEADINGS.test(h)));
    for (const option of result.options) {
      for (const heading of [/^Noise/, /^Bias current/, /^Offset/, /^Slew rate/]) {
        expect(clean(cellOf(report, option.topology, heading).textContent)).toBe(clean(cellOf(page, option.topology, heading).textContent));
      }
    }
  });

  test('a ranking stored before the targets existed (no target facts) shows no target column', () => {
    const result = hydrophonePreamp();
    for (const option of result.options) {
      const f = option.figures as unknown as Record<string, unknown>;
      for (const key of Object.keys(f)) if (/TargetSet$/.test(key)) delete f[key];
    }
    expect(headings(pageTable(result)).filter((h) => TARGET_HEADINGS.test(h))).toEqual([]);
  });
});
