/**
 * Debian's ngspice (`apt-get install ngspice`, /usr/bin/ngspice) as a second reference simulator
 * for the tests, beside the registry's WebAssembly build (tests/helpers/spice.ts). Each run is a
 * batch-mode process in a fresh temporary directory: the netlist the product writes goes in as
 * a file, `ngspice -b -r out.raw` writes its result as a binary raw file (IEEE doubles, so no
 * printed digits are lost), and `readRawFile` turns that file into the same result shape the
 * WebAssembly build returns, so the product's measurement code (api/verification/spice-analyses.ts)
 * reads both builds the same way. One process takes about 20 ms here, so runs are not batched.
 *
 * HOME is the run's own directory, so a `~/.spiceinit` of the machine's user cannot change the
 * reference; Debian's system-wide spinit (code models only) still loads, as it does for anyone.
 */
import { execFile } from 'node:child_process';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { ComplexDataType, RealDataType, ResultType } from 'eecircuit-engine';
import { DEBIAN_NGSPICE_PATH } from './debian-ngspice-project';

/** One run may take this long before it counts as hung, ms (a run takes about 20 ms). */
const RUN_TIMEOUT_MS = 60_000;

interface ProcessOutput {
  code: number | null;
  stdout: string;
  stderr: string;
}

function runProcess(file: string, args: string[], cwd: string): Promise<ProcessOutput> {
  return new Promise((resolve, reject) => {
    execFile(file, args, { cwd, env: { PATH: process.env.PATH ?? '/usr/bin:/bin', HOME: cwd, LC_ALL: 'C' }, timeout: RUN_TIMEOUT_MS, maxBuffer: 16 * 1024 * 1024 }, (error, stdout, stderr) => {
      if (error && typeof error.code !== 'number') {
        reject(new Error(`${file} did not run: ${error.message}`));
        return;
      }
      resolve({ code: error ? (error.code as number) : 0, stdout, stderr });
    });
  });
}

/** The version line ngspice prints for `-v` (e.g. "ngspice-39"). */
export async function debianNgspiceVersion(path: string = DEBIAN_NGSPICE_PATH): Promise<string> {
  const directory = await mkdtemp(join(tmpdir(), 'longtail-ngspice-'));
  try {
    const { stdout } = await runProcess(path, ['-v'], directory);
    const version = /\bngspice-[0-9][^\s:]*/.exec(stdout)?.[0];
    if (!version) throw new Error(`${path} -v printed no ngspice version:\n${stdout}`);
    return version;
  } finally {
    await rm(directory, { recursive: true, force: true });
  }
}

/**
 * Reads an ngspice binary raw file holding one plot: the text header up to `Binary:`, then per
 * point one little-endian double per variable (two, real and imaginary, when the plot's flags
 * say complex). The header is kept as text (its `Plotname:` line names the analysis).
 */
export function readRawFile(raw: Buffer): ResultType {
  const marker = raw.indexOf('Binary:\n');
  if (marker < 0) throw new Error('not an ngspice binary raw file (no "Binary:" line)');
  const header = raw.subarray(0, marker).toString('latin1');
  const field = (name: string): string => {
    const value = new RegExp(`^${name}:\\s*(.*)$`, 'm').exec(header)?.[1]?.trim();
    if (value === undefined) throw new Error(`ngspice raw file header has no "${name}:" line`);
    return value;
  };
  const complex = /\bcomplex\b/.test(field('Flags'));
  const numVariables = Number(field('No. Variables'));
  const numPoints = Number(field('No. Points'));
  const variableLines = header.slice(header.search(/^Variables:/m)).split('\n').slice(1, numVariables + 1);
  const variables = variableLines.map((line) => {
    const [, name, type] = line.trim().split(/\s+/);
    return { name, type: (['voltage', 'current', 'time', 'frequency'].includes(type) ? type : 'notype') as RealDataType['type'] };
  });
  if (variables.length !== numVariables || variables.some((v) => !v.name)) throw new Error(`ngspice raw file lists ${variables.length} of ${numVariables} variables`);
  const words = complex ? 2 : 1;
  const body = raw.subarray(marker + 'Binary:\n'.length);
  if (body.length < numPoints * numVariables * words * 8) throw new Error(`ngspice raw file is short: ${body.length} bytes for ${numPoints} points of ${numVariables} variables`);
  const at = (point: number, variable: number, word: number): number => body.readDoubleLE(((point * numVariables + variable) * words + word) * 8);
  const points = Array.from({ length: numPoints }, (_, point) => point);
  const variableNames = variables.map((v) => v.name);
  if (complex) {
    const data: ComplexDataType[] = variables.map((v, i) => ({ ...v, values: points.map((p) => ({ real: at(p, i, 0), img: at(p, i, 1) })) }));
    return { header, numVariables, variableNames, numPoints, dataType: 'complex', data };
  }
  const data: RealDataType[] = variables.map((v, i) => ({ ...v, values: points.map((p) => at(p, i, 0)) }));
  return { header, numVariables, variableNames, numPoints, dataType: 'real', data };
}

/**
 * Runs one netlist through Debian's ngspice in batch mode, in its own temporary directory
 * (removed afterwards), and returns the result as the WebAssembly build does. Throws with
 * ngspice's messages when the process fails, writes anything to stderr (errors and warnings
 * alike, as the WebAssembly runner refuses any error line), returns another plot than
 * `expectedPlot`, or a plot without a single point.
 */
export async function runDebianNgspice(netlist: string, expectedPlot?: string, path: string = DEBIAN_NGSPICE_PATH): Promise<ResultType> {
  const directory = await mkdtemp(join(tmpdir(), 'longtail-ngspice-'));
  try {
    await writeFile(join(directory, 'stage.cir'), netlist);
    const { code, stdout, stderr } = await runProcess(path, ['-b', '-r', 'out.raw', 'stage.cir'], directory);
    const fail = (why: string): never => {
      throw new Error(`${path} run failed (${why}):\n${stderr.trim()}\n--- output ---\n${stdout.trim()}\n--- netlist ---\n${netlist}`);
    };
    if (code !== 0) fail(`exit code ${code}`);
    if (stderr.trim() !== '') fail('messages on stderr');
    let raw: Buffer;
    try {
      raw = await readFile(join(directory, 'out.raw'));
    } catch {
      return fail('no raw file written');
    }
    const result = readRawFile(raw);
    const plot = /^Plotname:\s*(.*)$/m.exec(result.header)?.[1]?.trim() ?? '';
    if (result.numVariables === 0 || (expectedPlot !== undefined && plot !== expectedPlot)) fail(`plot "${plot}"`);
    // ngspice-39 answers a one-point `.ac dec n f f` with an empty plot and no message
    if (result.numPoints === 0) fail(`plot "${plot}" has no points`);
    return result;
  } finally {
    await rm(directory, { recursive: true, force: true });
  }
}
