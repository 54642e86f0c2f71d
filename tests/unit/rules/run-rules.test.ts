import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, test } from 'vitest';
import { createRuleSet } from '../../../rules/index';
import { loadRuleFiles, RULES_DIR, rulesetVersion, runRules, type RuleFile } from '../../../rules/run-rules';
import type { OptionFacts } from '#shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

const RULE_NAMES = [
  'bandwidth',
  'cmrr-differential-worst-case',
  'cmrr-target',
  'cmrr-yield',
  'gain-over-conditions',
  'gain-tolerance',
  'gain-vs-common-mode',
  'hazardous-voltage',
  'input-bias-current',
  'input-common-mode-high',
  'input-common-mode-low',
  'input-noise',
  'input-offset',
  'linear-input-range',
  'mains-referenced',
  'offset-drift',
  'operating-point',
  'output-common-mode',
  'output-swing',
  'output-swing-compression',
  'patient-connected',
  'power-budget',
  'psrr-negative',
  'psrr-positive',
  'slew-rate',
  'tail-current-drift',
  'tail-current-window',
];

const realRules = await loadRuleFiles();
const cmrrTargetText = await readFile(join(RULES_DIR, 'cmrr-target.json'), 'utf8');
const SINGLE_ENDED: Partial<OptionFacts> = {
  output: 'single-ended',
  isDifferentialOutput: false,
  cmrrDifferentialWorstCaseDb: null,
  cmrrDifferentialWorstCaseMarginDb: null,
  monteCarloYieldPercent: null,
  yieldMarginPercent: null,
};

let scratchDir: string | undefined;
afterEach(async () => {
  if (scratchDir) await rm(scratchDir, { recursive: true, force: true });
  scratchDir = undefined;
});

/** A fresh folder holding the given files (name -> text). */
async function ruleDir(files: Record<string, string>): Promise<string> {
  scratchDir = await mkdtemp(join(tmpdir(), 'longtail-rules-'));
  for (const [name, text] of Object.entries(files)) await writeFile(join(scratchDir, name), text);
  return scratchDir;
}

/** cmrr-target's JSON with `edit` applied to its parsed form. */
function editedCmrrTarget(edit: (rule: RuleFile) => void): string {
  const rule = JSON.parse(cmrrTargetText) as RuleFile;
  edit(rule);
  return JSON.stringify(rule, null, 2);
}

describe('loadRuleFiles', () => {
  test('when the rules folder is read, then every rule loads, sorted by name', () => {
    expect(realRules.map((rule) => rule.name)).toEqual(RULE_NAMES);
  });

  test.each([
    {
      title: 'a name that differs from its file',
      file: 'cmrr-goal.json',
      text: cmrrTargetText,
      message: /cmrr-goal\.json: \/name: "cmrr-target" differs from the file name "cmrr-goal"/,
    },
    {
      title: 'a bad kind',
      file: 'cmrr-target.json',
      text: editedCmrrTarget((rule) => Object.assign(rule, { kind: 'warning' })),
      message: /cmrr-target\.json: \/kind: must be "blocking", "advisory" or "caution", got "warning"/,
    },
    {
      title: 'no kind',
      file: 'cmrr-target.json',
      text: editedCmrrTarget((rule) => delete (rule as Partial<RuleFile>).kind),
      message: /cmrr-target\.json: \/kind: must be "blocking", "advisory" or "caution", got undefined/,
    },
    {
      title: 'a severity beside its kind',
      file: 'cmrr-target.json',
      text: editedCmrrTarget((rule) => Object.assign(rule.event.params, { severity: 'blocking' })),
      message: /cmrr-target\.json: \/event\/params: unexpected key "severity"/,
    },
    {
      title: 'no title',
      file: 'cmrr-target.json',
      text: editedCmrrTarget((rule) => delete (rule as Partial<RuleFile>).title),
      message: /cmrr-target\.json: \/title: must be a one-line name of 1-60 characters without braces, got undefined/,
    },
    {
      title: 'an empty title',
      file: 'cmrr-target.json',
      text: editedCmrrTarget((rule) => (rule.title = ' ')),
      message: /cmrr-target\.json: \/title: must be a one-line name/,
    },
    {
      title: 'a title over two lines',
      file: 'cmrr-target.json',
      text: editedCmrrTarget((rule) => (rule.title = 'Rejection,\ntail-limited')),
      message: /cmrr-target\.json: \/title: must be a one-line name/,
    },
    {
      title: 'a title longer than a table cell takes',
      file: 'cmrr-target.json',
      text: editedCmrrTarget((rule) => (rule.title = 'R'.repeat(61))),
      message: /cmrr-target\.json: \/title: must be a one-line name of 1-60 characters/,
    },
    {
      title: 'no figure',
      file: 'cmrr-target.json',
      text: editedCmrrTarget((rule) => delete (rule as Partial<RuleFile>).figure),
      message: /cmrr-target\.json: \/figure: must be a numeric fact or null, got undefined/,
    },
    {
      title: 'a figure that is no fact',
      file: 'cmrr-target.json',
      text: editedCmrrTarget((rule) => Object.assign(rule, { figure: 'cmrrDb' })),
      message: /cmrr-target\.json: \/figure: must be a numeric fact or null, got "cmrrDb"/,
    },
    {
      title: 'a figure that is a text fact',
      file: 'cmrr-target.json',
      text: editedCmrrTarget((rule) => Object.assign(rule, { figure: 'worstCmrrCorner' })),
      message: /cmrr-target\.json: \/figure: must be a numeric fact or null, got "worstCmrrCorner"/,
    },
    {
      title: 'text that is not JSON',
      file: 'cmrr-target.json',
      text: '{ "name": ',
      message: /cmrr-target\.json: /,
    },
    {
      title: 'a template naming an unknown fact',
      file: 'cmrr-target.json',
      text: editedCmrrTarget((rule) => (rule.event.params.passReason = '{cmrrDb:dB1} predicted')),
      message: /passReason: \{cmrrDb:dB1\}: unknown fact "cmrrDb"/,
    },
    {
      title: 'a condition on an unknown fact',
      file: 'cmrr-target.json',
      text: editedCmrrTarget((rule) => (rule.conditions = { all: [{ fact: 'cmrrMargin', operator: 'greaterThanInclusive', value: 0 }] })),
      message: /\/conditions\/all\/0\/fact: unknown fact "cmrrMargin"/,
    },
    {
      title: 'appliesWhen without its not-applicable branch in the conditions',
      file: 'cmrr-target.json',
      text: editedCmrrTarget((rule) =>
        Object.assign(rule.event.params, { appliesWhen: 'isDifferentialOutput', notApplicableReason: 'Not applicable.' }),
      ),
      message: /\/conditions: with appliesWhen, must be "any"/,
    },
  ])('when a file has $title, then loading throws naming the file', async ({ file, text, message }) => {
    const dir = await ruleDir({ [file]: text });
    await expect(loadRuleFiles(dir)).rejects.toThrow(message);
  });

  test('when the folder holds no rule files, then loading throws', async () => {
    const dir = await ruleDir({});
    await expect(loadRuleFiles(dir)).rejects.toThrow(/No rule files/);
  });
});

describe('rulesetVersion', () => {
  test('when the same files load twice, then the version is the same sha256', async () => {
    const version = rulesetVersion(realRules);
    expect(version).toMatch(/^[0-9a-f]{64}$/);
    expect(rulesetVersion(await loadRuleFiles())).toBe(version);
  });

  test('when a file is only reformatted or its keys reordered, then the version stays', async () => {
    const reordered = editedCmrrTarget(() => undefined).replace(/\n\s*/g, '');
    const parsed = JSON.parse(reordered) as RuleFile;
    const keysReversed = JSON.stringify(Object.fromEntries(Object.entries(parsed).reverse()));
    const a = await loadRuleFiles(await ruleDir({ 'cmrr-target.json': cmrrTargetText }));
    const b = await loadRuleFiles(await ruleDir({ 'cmrr-target.json': keysReversed }));
    expect(rulesetVersion(b)).toBe(rulesetVersion(a));
  });

  test('when a rule changes, then the version changes', async () => {
    const changed = editedCmrrTarget((rule) => (rule.event.params.passReason += ' Edited.'));
    const a = await loadRuleFiles(await ruleDir({ 'cmrr-target.json': cmrrTargetText }));
    const b = await loadRuleFiles(await ruleDir({ 'cmrr-target.json': changed }));
    expect(rulesetVersion(b)).not.toBe(rulesetVersion(a));
  });

  test('when the same rules come in another order, then the version stays', () => {
    expect(rulesetVersion([...realRules].reverse())).toBe(rulesetVersion(realRules));
  });
});

describe('runRules', () => {
  test('when rules are passed in any order, then every rule reports once, sorted by name', async () => {
    const checks = await runRules([...realRules].reverse(), makeOptionFacts());
    expect(checks.map((check) => check.rule)).toEqual(RULE_NAMES);
    expect(checks.every((check) => check.passed && check.reason.length > 0)).toBe(true);
  });

  test('when checks are made, then each carries its rule file\'s title, kind and figure, a caution counting as advisory', async () => {
    const checks = await runRules(realRules, makeOptionFacts());
    for (const check of checks) {
      const file = JSON.parse(await readFile(join(RULES_DIR, `${check.rule}.json`), 'utf8')) as RuleFile;
      expect(check).toMatchObject({ title: file.title, kind: file.kind, figure: file.figure });
      expect(check.severity).toBe(file.kind === 'blocking' ? 'blocking' : 'advisory');
    }
    expect(checks.filter((check) => check.kind === 'caution').map((check) => check.rule)).toEqual(['hazardous-voltage', 'mains-referenced', 'patient-connected']);
  });

  test('when rules fail, then they are still reported, with the passing ones', async () => {
    const checks = await runRules(realRules, makeOptionFacts({ railSpanV: 70, hazardousVoltageMarginV: -10, powerWorstW: 0.0612, powerMarginW: -0.0112 }));
    expect(checks).toHaveLength(RULE_NAMES.length);
    expect(checks.filter((check) => !check.passed).map((check) => check.rule)).toEqual(['hazardous-voltage', 'power-budget']);
  });

  test('when the output is single-ended, then the differential-only checks pass as not applicable with a null margin', async () => {
    const checks = await runRules(realRules, makeOptionFacts(SINGLE_ENDED));
    for (const rule of ['cmrr-differential-worst-case', 'cmrr-yield']) {
      const check = checks.find((c) => c.rule === rule);
      expect(check).toMatchObject({ passed: true, margin: null });
      expect(check?.reason).toMatch(/^Not applicable: /);
    }
  });

  test('when a check applies, then its gate does not excuse a failing margin', async () => {
    const checks = await runRules(realRules, makeOptionFacts({ topology: 'resistor', isResistorTail: true, gainVsCommonModeMarginPercent: -1 }));
    expect(checks.find((c) => c.rule === 'gain-vs-common-mode')).toMatchObject({ passed: false, margin: -1 });
  });

  test('when a fact is missing, then running throws instead of deciding', async () => {
    const { outputCmrrMarginDb: _omitted, ...facts } = makeOptionFacts();
    await expect(runRules(realRules, facts as OptionFacts)).rejects.toThrow(/outputCmrrMarginDb/);
  });

  test.each<Partial<OptionFacts>>([{ powerMarginW: Number.NaN }, { patientConnected: undefined }, { outputCmrrMarginDb: null as never }])(
    'when a fact a condition reads is malformed (%o), then running throws naming it',
    async (overrides) => {
      const [fact] = Object.keys(overrides);
      await expect(runRules(realRules, makeOptionFacts(overrides))).rejects.toThrow(new RegExp(`Fact "${fact}"`));
    },
  );

  test('when an applicable check meets a null figure, then running throws naming the rule', async () => {
    const facts = makeOptionFacts({ monteCarloYieldPercent: null, yieldMarginPercent: null });
    await expect(runRules(realRules, facts)).rejects.toThrow(/Rule cmrr-yield: .*monteCarloYieldPercent.* is null/);
  });

  test('when runs on one rule list overlap at every microtask offset, then each returns every check', async () => {
    // json-rules-engine's Engine keeps one status flag across runs; overlapping runs must not drop rules.
    const facts = makeOptionFacts();
    for (let offset = 0; offset < 300; offset += 1) {
      const first = runRules(realRules, facts);
      for (let i = 0; i < offset; i += 1) await Promise.resolve();
      const lengths = (await Promise.all([first, runRules(realRules, facts)])).map((checks) => checks.length);
      expect(lengths).toEqual([RULE_NAMES.length, RULE_NAMES.length]);
    }
  });
});

describe('createRuleSet', () => {
  test('when built from the loaded rules, then its version and checks match the runner', async () => {
    const ruleSet = createRuleSet(realRules);
    expect(ruleSet.version).toBe(rulesetVersion(realRules));
    expect(await ruleSet.evaluate(makeOptionFacts())).toEqual(await runRules(realRules, makeOptionFacts()));
  });

  test('when built, then it lists every rule with its title, kind, figure and severity, for checks an unsolved option cannot decide', () => {
    const ruleSet = createRuleSet(realRules);
    expect(ruleSet.rules.map((r) => r.rule)).toEqual(RULE_NAMES);
    const power = ruleSet.rules.find((r) => r.rule === 'power-budget');
    expect(power).toEqual({ rule: 'power-budget', title: 'Power budget', kind: 'blocking', figure: 'powerWorstW', severity: 'blocking' });
    const patient = ruleSet.rules.find((r) => r.rule === 'patient-connected');
    expect(patient).toMatchObject({ kind: 'caution', severity: 'advisory', figure: null });
  });

  test('when two rules share a name, then it throws', () => {
    expect(() => createRuleSet([realRules[0], realRules[0]])).toThrow(/Duplicate rule name "bandwidth"/);
  });

  test('when a rule passed in directly is invalid, then it throws naming the rule', () => {
    const bad = JSON.parse(cmrrTargetText) as RuleFile;
    Object.assign(bad.event.params, { severity: 'fatal' });
    expect(() => createRuleSet([bad])).toThrow(/cmrr-target.*severity/);
  });
});
