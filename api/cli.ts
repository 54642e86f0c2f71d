/**
 * The `longtail` command line (ENGINE-CONTRACT.md): read one JSON file (or "-" for standard
 * input), validate it against the shared schema, run the engine, print one JSON document.
 * Exit 0 on success; 2 with a one-line "/json/path: message" on bad input; 1 on an internal
 * fault. Never a stack trace for a user error (set LONGTAIL_DEBUG=1 to see one for a fault).
 */
import { readFileSync } from 'node:fs';
import { analyze, recommend, ConvergenceError, InputError } from '#shared/engine/index';
import { firstNonFinitePath } from '#shared/engine/finite';
import { formatIssue, isMosDesignInput, validateDesign, validateMosDesign, validateSpec, type ValidationResult } from '#shared/validate';
import { analyzeMos } from '#shared/engine/mos-stage';
import { loadRuleSet } from '../rules/index';

const USAGE = 'usage: longtail analyze FILE | longtail recommend FILE   (FILE may be "-" for standard input)';

class UsageError extends Error {}

function readInput(file: string): string {
  try {
    return readFileSync(file === '-' ? 0 : file, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code ?? 'unreadable';
    throw new UsageError(`cannot read ${file === '-' ? 'standard input' : file} (${code})`);
  }
}

function parseJson(text: string): unknown {
  try {
    // A UTF-8 byte-order mark (editors on some systems write one) is not part of the document
    return JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch (error) {
    throw new UsageError(`/: malformed JSON (${(error as Error).message})`);
  }
}

function validated<T>(result: ValidationResult<T>): T {
  if (!result.ok) throw new UsageError(result.errors.map(formatIssue).join('; '));
  return result.value;
}

async function run(command: string, input: unknown): Promise<unknown> {
  if (command === 'analyze') return isMosDesignInput(input) ? analyzeMos(validated(validateMosDesign(input))) : analyze(validated(validateDesign(input)));
  if (command === 'recommend') return recommend(validated(validateSpec(input)), await loadRuleSet());
  throw new UsageError(USAGE);
}

async function main(argv: string[]): Promise<number> {
  const [command, file, ...rest] = argv;
  try {
    if (!command || !file || rest.length > 0 || (command !== 'analyze' && command !== 'recommend')) throw new UsageError(USAGE);
    const output = await run(command, parseJson(readInput(file)));
    const badPath = firstNonFinitePath(output);
    if (badPath) throw new Error(`the engine produced a non-finite number at ${badPath}`);
    process.stdout.write(`${JSON.stringify(output, null, 2)}\n`);
    return 0;
  } catch (error) {
    if (error instanceof UsageError || error instanceof InputError) {
      process.stderr.write(`longtail: ${error.message}\n`);
      return 2;
    }
    if (error instanceof ConvergenceError) {
      process.stderr.write(`longtail: ${error.fields[0] ?? '/'}: this design cannot be solved: ${error.message}\n`);
      return 2;
    }
    process.stderr.write(`longtail: internal fault: ${(error as Error).message ?? String(error)}\n`);
    if (process.env.LONGTAIL_DEBUG) process.stderr.write(`${(error as Error).stack}\n`);
    return 1;
  }
}

// A reader that stops early (`| head`) closes the pipe: that is not a fault.
process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code === 'EPIPE') process.exit(process.exitCode ?? 0);
  throw error;
});

process.exitCode = await main(process.argv.slice(2));
