import { describe, expect, test } from 'vitest';
import { blockingShortCount, matchesTopologyText, optionRows, specTargets } from '../../../../web/src/features/proposals/lib/option-rows';
import { topologyName } from '../../../../web/src/lib/topology-names';
import type { Check } from '#shared/engine/types';
import { specOf, strainBridge, studioLine } from './fixtures';

describe('optionRows', () => {
  const result = strainBridge();
  const rows = optionRows(result);
  const row = (topology: string) => rows.find((r) => r.topology === topology)!;

  test('one row per option in ranking order, with readable names', () => {
    expect(rows.map((r) => r.rank)).toEqual([1, 2, 3, 4, 5, 6]);
    const ranked = [...result.options].sort((a, b) => a.rank - b.rank);
    expect(rows.map((r) => r.topology)).toEqual(ranked.map((o) => o.topology));
    expect(rows.map((r) => r.name)).toEqual(ranked.map((o) => topologyName(o.topology)));
  });

  test('the recommendation is marked on its row only', () => {
    expect(rows.filter((r) => r.recommended).map((r) => r.topology)).toEqual([result.recommended]);
  });

  test('figures are read from predicted and figures', () => {
    const option = result.options[0];
    expect(row('cascode')).toMatchObject({
      tailImpedanceAtFrequencyOhm: option.figures!.tailImpedanceAtFrequencyOhm,
      cmrrDcDb: option.predicted!.cmrrDb.singleEnded,
      cmrrAtFrequencyDb: option.figures!.cmrrAtFrequencyDb,
      mismatchWorstCaseDb: option.figures!.cmrrDifferentialWorstCaseDb,
      yieldPercent: option.figures!.monteCarloYieldPercent,
      tailCurrentA: option.predicted!.tailCurrentA,
      powerWorstW: option.figures!.powerWorstW,
      swingMarginV: option.figures!.swingMarginV,
    });
  });

  test('a failing blocking check marks its figure short; an advisory one a note; passing checks nothing', () => {
    const base = result.options.find((o) => o.topology === 'cascode')!;
    // Hand-set verdicts on the engine's checks: the power budget fails (blocking), the mismatch
    // worst case fails (advisory), every other check passes: each marks its own figure.
    const mark = (failing: Record<string, Check['severity']>) => {
      const checks = base.checks.map((c) => (c.rule in failing ? { ...c, passed: false, severity: failing[c.rule] } : { ...c, passed: true }));
      return optionRows({ ...result, options: [{ ...base, checks, passes: false }] })[0].standing;
    };
    expect(mark({ 'power-budget': 'blocking', 'cmrr-differential-worst-case': 'advisory' })).toEqual({ powerWorstW: 'short', mismatchWorstCaseDb: 'note' });
    // The rejection target judges the spec's output: this spec's is differential, so a failing
    // target marks the mismatch worst case short (a blocking failure outranks the advisory note).
    expect(base.figures!.isDifferentialOutput).toBe(true);
    expect(mark({ 'cmrr-target': 'blocking', 'cmrr-differential-worst-case': 'advisory' })).toEqual({ mismatchWorstCaseDb: 'short' });
    const singleEnded = { ...base, figures: { ...base.figures!, isDifferentialOutput: false } };
    const targetShort = singleEnded.checks.map((c) => (c.rule === 'cmrr-target' ? { ...c, passed: false } : { ...c, passed: true }));
    expect(optionRows({ ...result, options: [{ ...singleEnded, checks: targetShort, passes: false }] })[0].standing).toEqual({ cmrrAtFrequencyDb: 'short' });
    const [clean] = optionRows({ ...result, options: [{ ...base, checks: base.checks.map((c) => ({ ...c, passed: true })) }] });
    expect(clean.standing).toEqual({});
  });

  test('the count of blocking checks short: failing blocking checks only, not advisory or passing ones', () => {
    const check = (rule: string, severity: Check['severity'], passed: boolean): Check => ({ rule, severity, passed, reason: '', margin: passed ? 1 : -1 });
    const checks = [check('a', 'blocking', false), check('b', 'blocking', false), check('c', 'advisory', false), check('d', 'blocking', true)];
    expect(blockingShortCount({ ...result.options[0], checks })).toBe(2);
  });

  test("each row carries its option's count; passing options none", () => {
    expect(rows.map((r) => r.blockingShortCount)).toEqual(result.options.map(blockingShortCount));
    for (const r of rows.filter((r) => r.passes)) expect(r.blockingShortCount).toBe(0);
    expect(rows.some((r) => r.blockingShortCount > 0)).toBe(true);
  });

  test('an unsolved option keeps its row with empty figures', () => {
    const broken = { ...result.options[0], predicted: null, figures: null, passes: false };
    const [only] = optionRows({ ...result, options: [broken] });
    expect(only.unsolved).toBe(true);
    expect(only.cmrrDcDb).toBeNull();
    expect(only.tailCurrentA).toBeNull();
  });
});

describe('matchesTopologyText', () => {
  test.each([
    ['', 'resistor', true],
    ['mirror', 'simple-mirror', true],
    ['MIRROR', 'cascode', true],
    ['mirror', 'widlar', false],
    ['widlar', 'widlar', true],
    ['degenerated-m', 'degenerated-mirror', true],
    ['  wilson ', 'wilson', true],
  ] as const)('"%s" against %s: %s', (text, topology, expected) => {
    expect(matchesTopologyText({ topology, name: topologyName(topology) }, text)).toBe(expected);
  });
});

describe('specTargets', () => {
  test('differential spec: frequency, requirement and margin, yield', () => {
    const { cmrr, gain } = specOf('strain');
    expect(specTargets(strainBridge())).toMatchObject({ frequencyHz: cmrr.atFrequencyHz, requiredDb: cmrr.minDb, marginDb: cmrr.marginDb, requiredYieldPercent: cmrr.minYieldPercent, differential: true, gainTarget: gain.target });
  });
  test('single-ended spec', () => {
    expect(specTargets(studioLine())?.differential).toBe(false);
  });
});

test('every topology has a readable name', () => {
  expect(['resistor', 'simple-mirror', 'degenerated-mirror', 'widlar', 'wilson', 'cascode'].map(topologyName)).toEqual(['Resistor', 'Simple mirror', 'Degenerated mirror', 'Widlar source', 'Wilson mirror', 'Cascode mirror']);
  expect(topologyName('something-new')).toBe('something new');
});
