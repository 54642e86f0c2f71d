/**
 * The `longtail` command line (api/cli.ts) as a child process, the way design reviews and batch
 * runs drive it (ENGINE-CONTRACT.md): one JSON document on stdout and exit 0, or exit 2 with a
 * one-line message on stderr naming the offending field by its JSON path, never a stack trace.
 * `node --import tsx api/cli.ts` is used rather than `npm run --silent longtail --`: measured at
 * about 1.6 s against 2.1–3.6 s per run. The ten runs share the cores in beforeAll.
 */
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { beforeAll, describe, expect, test } from 'vitest';
import { analyze } from '#shared/engine/index';
import { validateDesign } from '#shared/validate';
import { CONTRACT_FIELDS } from '../../helpers/contract-fields';

const REPO_ROOT = fileURLToPath(new URL('../../../', import.meta.url));
const fixture = (name: string) => fileURLToPath(new URL(`./fixtures/${name}`, import.meta.url));

interface Run {
  code: number | null;
  stdout: string;
  stderr: string;
}

function runCli(args: string[], stdin?: string): Promise<Run> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'api/cli.ts', ...args], { cwd: REPO_ROOT, env: { ...process.env, LONGTAIL_DEBUG: '' } });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d) => (stdout += d));
    child.stderr.on('data', (d) => (stderr += d));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, stdout, stderr }));
    child.stdin.end(stdin ?? '');
  });
}

const CASES = {
  analyzeFile: () => runCli(['analyze', fixture('design-simple-mirror.json')]),
  recommendFile: () => runCli(['recommend', fixture('spec-quillfen-bridge.json')]),
  analyzeStdin: () => runCli(['analyze', '-'], readFileSync(fixture('design-simple-mirror.json'), 'utf8')),
  // The same design saved with a UTF-8 byte-order mark (EF BB BF) in front, as some editors write it
  analyzeByteOrderMark: () => runCli(['analyze', fixture('design-byte-order-mark.json')]),
  analyzeByteOrderMarkStdin: () => runCli(['analyze', '-'], `\uFEFF${readFileSync(fixture('design-simple-mirror.json'), 'utf8')}`),
  malformed: () => runCli(['analyze', fixture('malformed.json')]),
  wrongType: () => runCli(['analyze', fixture('wrong-type.json')]),
  outOfRange: () => runCli(['analyze', fixture('out-of-range.json')]),
  unknownTopology: () => runCli(['analyze', fixture('unknown-topology.json')]),
  railsReversed: () => runCli(['analyze', fixture('rails-reversed.json')]),
  hardToSolve: () => runCli(['analyze', fixture('hard-to-solve.json')]),
  missingFile: () => runCli(['analyze', fixture('no-such-file.json')]),
  noArguments: () => runCli([]),
};
type CaseName = keyof typeof CASES;
const runs = {} as Record<CaseName, Run>;

beforeAll(async () => {
  // A few at a time: each run is CPU-bound (tsx compiles the sources), so more than the cores buys nothing
  const queue = Object.keys(CASES) as CaseName[];
  const worker = async () => {
    for (let name = queue.shift(); name; name = queue.shift()) runs[name] = await CASES[name]();
  };
  await Promise.all(Array.from({ length: Math.max(2, availableParallelism()) }, worker));
}, 120_000);


describe('longtail on good input', () => {
  test('analyze FILE: exit 0, one JSON document with every contract field, nothing on stderr', () => {
    const run = runs.analyzeFile;
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    const output = JSON.parse(run.stdout);
    for (const field of CONTRACT_FIELDS) expect(output, field).toHaveProperty(field);
    expect(output.cmrrDb).toHaveProperty('singleEnded');
    expect(output.cmrrDb).toHaveProperty('differential');
  });

  test('analyze FILE prints what the engine computes for the validated design (same code path, JSON round trip)', () => {
    const validated = validateDesign(JSON.parse(readFileSync(fixture('design-simple-mirror.json'), 'utf8')));
    if (!validated.ok) throw new Error('fixture should be valid');
    expect(JSON.parse(runs.analyzeFile.stdout)).toEqual(JSON.parse(JSON.stringify(analyze(validated.value))));
  });

  test('analyze - reads standard input and prints the same document', () => {
    expect(runs.analyzeStdin.code, runs.analyzeStdin.stderr).toBe(0);
    expect(runs.analyzeStdin.stderr).toBe('');
    expect(runs.analyzeStdin.stdout).toBe(runs.analyzeFile.stdout);
  });

  test('a UTF-8 byte-order mark before the JSON (file or standard input) is not part of the document: same output', () => {
    expect(readFileSync(fixture('design-byte-order-mark.json')).subarray(0, 3)).toEqual(Buffer.from([0xef, 0xbb, 0xbf]));
    for (const run of [runs.analyzeByteOrderMark, runs.analyzeByteOrderMarkStdin]) {
      expect(run.stderr).toBe('');
      expect(run.code).toBe(0);
      expect(run.stdout).toBe(runs.analyzeFile.stdout);
    }
  });

  test('recommend FILE: exit 0, versions, the notice, one option per listed topology', () => {
    const run = runs.recommendFile;
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    const output = JSON.parse(run.stdout);
    expect(output.engineVersion).toMatch(/^\d+\.\d+\.\d+$/);
    expect(output.rulesetVersion).toMatch(/^[0-9a-f]{64}$/); // sha256 of the rule files [contract]
    expect(output).toHaveProperty('recommended');
    expect(output.notice).toMatch(/estimate/i);
    expect(output.options.map((o: { topology: string }) => o.topology).sort()).toEqual(['resistor', 'simple-mirror', 'wilson']);
    for (const option of output.options) {
      expect(option).toHaveProperty('design');
      expect(option).toHaveProperty('predicted');
      expect(option.checks.length).toBeGreaterThan(0);
    }
  });
});

describe('longtail on bad input: exit 2, one line on stderr, no stack trace', () => {
  test.each<[CaseName, RegExp]>([
    ['malformed', /^longtail: \//],
    ['wrongType', /^longtail: \/supply\/positiveV\b/],
    ['outOfRange', /^longtail: \/collectorResistanceOhm\b/],
    ['unknownTopology', /^longtail: \/tail\/topology\b/],
    ['railsReversed', /^longtail: \/supply\/negativeV\b/],
    ['hardToSolve', /^longtail: \/pairEmitterResistanceOhm: this design cannot be solved: .*the fields that make it hard: \/pairEmitterResistanceOhm, \/collectorResistanceOhm, \/tail\/referenceResistanceOhm/],
    ['missingFile', /^longtail: .*no-such-file\.json/],
    ['noArguments', /^longtail: usage: /],
  ])('%s: stderr matches %s', (name, pattern) => {
    const run = runs[name];
    expect(run.code, run.stderr).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toMatch(pattern);
    expect(run.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(run.stderr).not.toContain('    at ');
  });
});

describe('a MOS design ("nmos" / "pmos", ENGINE-CONTRACT.md "Families")', () => {
  const design = {
    device: { family: 'pmos', model: { VTO: -0.7, KP: 40e-6, LAMBDA: 0.05, GAMMA: 0.5, PHI: 0.65 } },
    supply: { positiveV: 5, negativeV: -5 },
    drainResistanceOhm: 10_000,
    pair: { widthM: 40e-6, lengthM: 2e-6 },
    tail: { topology: 'resistor', resistanceOhm: 10_000 },
  };

  test('analyze prints the MOS figures (drain names for collector ones) and exits 0', async () => {
    const run = await runCli(['analyze', '-'], JSON.stringify(design));
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    const out = JSON.parse(run.stdout) as Record<string, unknown>;
    for (const field of ['tailCurrentA', 'drainCurrentA', 'drainVoltageV', 'tailNodeVoltageV', 'transconductanceS', 'tailOutputResistanceOhm', 'differentialGain', 'singleEndedGain', 'commonModeGain', 'differentialCommonModeGain', 'cmrrDb', 'cmrrCornerHz', 'inputBiasCurrentA', 'powerW', 'warnings']) {
      expect(out, field).toHaveProperty(field);
    }
    expect(out).not.toHaveProperty('collectorCurrentA');
    expect(out.inputBiasCurrentA).toBe(0);
    // a PMOS pair's drains hang below the tail towards the negative rail
    expect(out.drainVoltageV as number).toBeLessThan(0);
  }, 20_000);

  test('a MOS design with a bipolar field exits 2 naming it', async () => {
    const run = await runCli(['analyze', '-'], JSON.stringify({ ...design, collectorResistanceOhm: 1000 }));
    expect(run.code).toBe(2);
    expect(run.stderr).toBe('longtail: /collectorResistanceOhm: is not a known field here (remove it or check its spelling)\n');
  }, 20_000);
});
