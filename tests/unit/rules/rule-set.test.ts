import { mkdtemp, readdir, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, test } from 'vitest';
import { createRuleSet } from '../../../rules/index';
import { loadRuleFiles, RULES_DIR, rulesetVersion, runRules } from '../../../rules/run-rules';
import { makeOptionFacts } from '../../helpers/option-facts';

// The rule set as the files on disk define it (read here with plain fs and JSON.parse), and the
// parts of a check that come from a rule file's params: the unit, the thin-margin flag, the
// not-applicable branch.

const files = (await readdir(RULES_DIR)).filter((f) => f.endsWith('.json')).sort();
const onDisk = await Promise.all(files.map(async (f) => JSON.parse(await readFile(join(RULES_DIR, f), 'utf8')) as { name: string; title: string; kind: string; figure: string | null }));
const rules = await loadRuleFiles();

let scratch: string | undefined;
afterEach(async () => {
  if (scratch) await rm(scratch, { recursive: true, force: true });
  scratch = undefined;
});

describe('loadRuleFiles and createRuleSet', () => {
  test('the set lists every rule file by name with its title, kind and figure, sorted by name; only "blocking" blocks', () => {
    const expected = onDisk
      .map((r) => ({ rule: r.name, title: r.title, kind: r.kind, figure: r.figure, severity: r.kind === 'blocking' ? 'blocking' : 'advisory' }))
      .sort((a, b) => (a.rule < b.rule ? -1 : 1));
    expect(createRuleSet(rules).rules).toEqual(expected);
    expect(createRuleSet([...rules].reverse()).rules).toEqual(expected);
    expect(rules.map((r) => r.name)).toEqual(expected.map((r) => r.rule));
  });

  test('the loaded rules are frozen all the way down', () => {
    expect(Object.isFrozen(rules)).toBe(true);
    expect(Object.isFrozen(rules[0].event.params)).toBe(true);
    expect(Object.isFrozen(rules[0].conditions)).toBe(true);
  });

  test('files other than *.json are ignored; a file that is no JSON is named with the parser\u2019s message', async () => {
    scratch = await mkdtemp(join(tmpdir(), 'longtail-rules-'));
    await writeFile(join(scratch, 'cmrr-target.json'), await readFile(join(RULES_DIR, 'cmrr-target.json'), 'utf8'));
    await writeFile(join(scratch, 'notes.txt'), 'not a rule');
    expect((await loadRuleFiles(scratch)).map((r) => r.name)).toEqual(['cmrr-target']);
    await writeFile(join(scratch, 'broken.json'), '{ "name": ');
    await expect(loadRuleFiles(scratch)).rejects.toThrow(new RegExp(`^Invalid rule ${join(scratch, 'broken.json').replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}: .+JSON`));
  });

  test('the version is the same whatever order the rules come in, and differs when one is left out', () => {
    expect(rulesetVersion([...rules].reverse())).toBe(rulesetVersion(rules));
    expect(rulesetVersion(rules.slice(1))).not.toBe(rulesetVersion(rules));
    expect(rulesetVersion(rules)).toMatch(/^[0-9a-f]{64}$/); // sha256 in hex (FIPS 180-4: 256 bits)
  });
});

describe('checks from a rule file\u2019s params (rules/cmrr-target.json: thin margin below 1 dB)', () => {
  const cmrrTarget = async (marginDb: number) =>
    (await runRules(rules, makeOptionFacts({ outputCmrrMarginDb: marginDb, outputCmrrDb: 86 + marginDb }))).find((c) => c.rule === 'cmrr-target')!;

  test.each([
    [0.5, true, true],
    [0, true, true],
    [0.999, true, true],
    [1, true, undefined],
    [8.2, true, undefined],
    [-0.5, false, undefined],
  ])('a margin of %d dB: passed %s, thin margin %s', async (marginDb, passed, thin) => {
    const check = await cmrrTarget(marginDb);
    expect(check.passed).toBe(passed);
    expect(check.thinMargin).toBe(thin);
    expect(check.margin).toBe(marginDb);
    expect(check.marginUnit).toBe('dB');
    expect(check.applicable).toBe(true);
    expect(check.severity).toBe('blocking');
  });

  test('a check without a margin fact has no unit (rules/mains-referenced.json: marginFact null)', async () => {
    const mains = onDisk.find((r) => r.name === 'mains-referenced') as unknown as { event: { params: { marginFact: unknown } } };
    expect(mains.event.params.marginFact).toBeNull();
    const check = (await runRules(rules, makeOptionFacts())).find((c) => c.rule === 'mains-referenced')!;
    expect(check.margin).toBeNull();
    expect(check).not.toHaveProperty('marginUnit');
  });
});
