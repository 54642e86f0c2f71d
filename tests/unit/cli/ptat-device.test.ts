/**
 * The PTAT tail's PNP through the `longtail` command line (ENGINE-CONTRACT.md: bad input exits 2
 * with one line on stderr naming the field by its JSON path): `analyze` of a PTAT design without
 * `device.pnp`, and `recommend` of a spec that lists the PTAT source without it, are refused by the
 * same validation the server uses; with the PNP the design is analysed. A PNP stage
 * (`device.family` "pnp") with the PTAT tail is refused at `/tail/topology`.
 */
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { beforeAll, describe, expect, test } from 'vitest';

const REPO_ROOT = fileURLToPath(new URL('../../../', import.meta.url));
const withoutPnp = JSON.parse(readFileSync(new URL('./fixtures/design-ptat-without-pnp.json', import.meta.url), 'utf8')) as { device: Record<string, unknown> };
/** An invented PNP: current gain, Early voltage and IS in the usual small-signal ranges. */
const PNP = { beta: 115, earlyVoltageV: 52, saturationCurrentA: 4.1e-15 };
const SPEC = { title: 'Fen gauge input', supply: { positiveV: 9, negativeV: -9 }, gain: { target: 30 }, cmrr: { minDb: 60 }, topologies: ['widlar', 'ptat'] };

interface Run {
  code: number | null;
  stdout: string;
  stderr: string;
}

function runCli(command: string, document: unknown): Promise<Run> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'api/cli.ts', command, '-'], { cwd: REPO_ROOT, env: { ...process.env, LONGTAIL_DEBUG: '' } });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d) => (stdout += d));
    child.stderr.on('data', (d) => (stderr += d));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, stdout, stderr }));
    child.stdin.end(JSON.stringify(document));
  });
}

const runs = {} as Record<'analyzeWithout' | 'recommendWithout' | 'analyzeWith' | 'analyzePnpStage' | 'analyzePnpMirror', Run>;
/** The same design as a PNP stage (`device.family` "pnp"), the PTAT tail and then a simple mirror. */
const pnpStage = { ...withoutPnp, device: { ...withoutPnp.device, family: 'pnp' } };

beforeAll(async () => {
  [runs.analyzeWithout, runs.recommendWithout] = await Promise.all([runCli('analyze', withoutPnp), runCli('recommend', SPEC)]);
  runs.analyzeWith = await runCli('analyze', { ...withoutPnp, device: { ...withoutPnp.device, pnp: PNP } });
  [runs.analyzePnpStage, runs.analyzePnpMirror] = await Promise.all([
    runCli('analyze', { ...pnpStage, device: { ...pnpStage.device, pnp: PNP } }),
    runCli('analyze', { ...pnpStage, tail: { topology: 'simple-mirror', referenceResistanceOhm: 15000 } }),
  ]);
}, 60_000);

describe('longtail and the PTAT tail’s PNP', () => {
  test.each([
    ['analyze of a PTAT design without device.pnp', 'analyzeWithout' as const, 'the tail is the PTAT (constant-gm) source'],
    ['recommend of a spec listing ptat without device.pnp', 'recommendWithout' as const, 'the tail options include the PTAT (constant-gm) source'],
  ])('%s: exit 2, one line naming /device/pnp, nothing on stdout', (_title, name, words) => {
    const run = runs[name];
    expect(run.code, run.stderr).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(/^longtail: \/device\/pnp: is required: /);
    expect(run.stderr).toContain(words);
  });

  test('analyze of the same design with device.pnp: exit 0 and a tail current', () => {
    const run = runs.analyzeWith;
    expect(run.code, run.stderr).toBe(0);
    expect(JSON.parse(run.stdout).tailCurrentA).toBeGreaterThan(0);
  });

  test('analyze of a PNP stage with the PTAT tail (its mirror would need an NPN): exit 2, one line naming /tail/topology', () => {
    const run = runs.analyzePnpStage;
    expect(run.code, run.stderr).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(/^longtail: \/tail\/topology: the tail is the PTAT \(constant-gm\) source, which needs an NPN pair/);
  });

  test('analyze of the PNP stage with a simple mirror: exit 0, a positive tail current, collectors below the inputs', () => {
    const run = runs.analyzePnpMirror;
    expect(run.code, run.stderr).toBe(0);
    const result = JSON.parse(run.stdout) as { tailCurrentA: number; collectorVoltageV: number; tailNodeVoltageV: number };
    expect(result.tailCurrentA).toBeGreaterThan(0);
    // a PNP pair's loads hang from the negative rail and its tail node sits a VEB above the inputs (0 V)
    expect(result.collectorVoltageV).toBeLessThan(0);
    expect(result.tailNodeVoltageV).toBeGreaterThan(0.4);
  });
});
