// `npm run mutation [-- <folder or file> ...]`: StrykerJS over the engine, the units, the
// validation and the rules, one Stryker run per target (each with its own incremental file and
// report under reports/mutation/, out of git), then the score per folder from every report there.
// `npm run mutation -- shared/units` or `LONGTAIL_MUTATION_TARGETS=shared/units,rules` runs a
// part; `npm run mutation -- shared/engine/sizing.ts` one file; `npm run mutation -- --summary`
// only prints the scores of the reports already written; `--force` ignores the incremental files.
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';

/** The mutated folders, the tests that cover each, and the score each must reach (issue 14). */
const FOLDERS = [
  // The engine file by file, each against the unit tests that import it (perFile, importingTests). With every
  // engine and reference test, a mutant of the code every figure passes through (the operating
  // point, the device) ran hundreds of tests, some with ngspice: the engine took hours. Fewer
  // tests can only kill fewer mutants, so the score printed is a lower bound of that one.
  { folder: 'shared/engine', tests: ['tests/unit/engine/**/*.test.ts'], testDir: 'tests/unit/engine', perFile: true, target: 85 },
  { folder: 'shared/units', tests: ['tests/unit/units/**/*.test.ts'], target: 75 },
  {
    folder: 'shared/validation',
    tests: ['tests/unit/schema/**/*.test.ts', 'tests/unit/import/spec-file.test.ts'],
    target: 75,
  },
  // The rule code's own tests; the per-rule and boundary tests pin the JSON thresholds, which are
  // not mutated, and would make every static mutant run the engine for each rule.
  {
    folder: 'rules',
    tests: [
      'tests/unit/rules/validate-rule.test.ts',
      'tests/unit/rules/run-rules.test.ts',
      'tests/unit/rules/rule-set.test.ts',
      'tests/unit/rules/format-reason.test.ts',
      'tests/unit/rules/fact-kinds.test.ts',
    ],
    target: 85,
  },
];

function folderOf(file) {
  const normal = file.split(path.sep).join('/').replace(/^\.\//, '').replace(/\/$/, '');
  return FOLDERS.find((f) => normal === f.folder || normal.startsWith(`${f.folder}/`));
}

const args = process.argv.slice(2);
const summaryOnly = args.includes('--summary');
// --force: every mutant again. Incremental mode keeps a static mutant's result (one evaluated when
// a module loads, as a table entry) until its own code changes, even after a test that would now
// kill it is added.
const force = args.includes('--force');
const named = args.filter((a) => !a.startsWith('--'));
const fromEnvironment = (process.env.LONGTAIL_MUTATION_TARGETS ?? '').split(',').filter(Boolean);
const targets = named.length ? named : fromEnvironment.length ? fromEnvironment : FOLDERS.map((f) => f.folder);

/**
 * The test files of `owner.testDir` that import `file`: by its own module specifier
 * (#shared/engine/name), or the folder's index where the index re-exports from it; when none
 * does, the folder's whole test set.
 */
function importingTests(owner, file) {
  const name = path.basename(file, '.ts');
  const base = owner.folder.replace(/^shared\//, '#shared/');
  const testFiles = readdirSync(owner.testDir, { recursive: true })
    .filter((f) => /\.test\.tsx?$/.test(f))
    .map((f) => path.join(owner.testDir, f).split(path.sep).join('/'))
    .sort();
  const importing = (specifier) => testFiles.filter((f) => readFileSync(f, 'utf8').includes(`from '${specifier}'`));
  const index = path.join(owner.folder, 'index.ts');
  const reExported = existsSync(index) && readFileSync(index, 'utf8').includes(`from './${name}'`);
  const tests = [...new Set([...importing(`${base}/${name}`), ...(reExported ? importing(`${base}/index`) : [])])].sort();
  return tests.length ? tests : owner.tests;
}

/** A mutant the shared-module pass left alone because it runs when a module loads (stryker.config.mjs). */
const isStaticIgnored = (m) => m.status === 'Ignored' && /static/i.test(m.statusReason ?? '');

/** One Stryker run; `extra`: more environment (the isolated pass's). */
function stryker(target, slug, tests, extra = {}) {
  const started = Date.now();
  const run = spawnSync('npx', ['stryker', 'run', 'stryker.config.mjs', ...(force ? ['--force'] : [])], {
    stdio: 'inherit',
    env: { ...process.env, LONGTAIL_MUTATION_TARGET: target, LONGTAIL_MUTATION_SLUG: slug, LONGTAIL_MUTATION_TESTS: tests.join(','), ...extra },
  });
  console.log(`== ${slug}: ${Math.round((Date.now() - started) / 1000)} s`);
  if (run.status !== 0) process.exit(run.status ?? 1);
}

if (!summaryOnly) {
  for (const raw of targets) {
    const target = raw.replace(/^\.\//, '').replace(/\/$/, '');
    const owner = folderOf(target);
    if (!owner || !existsSync(target)) {
      console.error(`mutation: "${raw}" is not one of ${FOLDERS.map((f) => f.folder).join(', ')} or a file in them`);
      process.exit(2);
    }
    const files = owner.perFile
      ? target === owner.folder
        ? readdirSync(target).filter((f) => /\.ts$/.test(f) && !/\.d\.ts$/.test(f)).map((f) => `${target}/${f}`)
        : [target]
      : [target];
    for (const one of files) mutateTarget(one, owner.perFile ? importingTests(owner, one) : owner.tests);
  }
}

/** One target's run with its tests, then its static mutants' isolated run. */
function mutateTarget(target, tests) {
  const slug = target.replace(/\.ts$/, '').replace(/[^a-z0-9]+/gi, '-');
  console.log(`\n== mutating ${target} (tests: ${tests.join(', ')})`);
  stryker(target, slug, tests);
  // The static mutants, each with a fresh module graph per test file: the lines that hold them
  const reportFile = path.join('reports/mutation', slug, 'mutation.json');
  if (!existsSync(reportFile)) return; // a file with no mutants (types only) writes none
  const report = JSON.parse(readFileSync(reportFile, 'utf8'));
  const ranges = [];
  for (const [name, result] of Object.entries(report.files)) {
    const relative = path.relative(process.cwd(), path.resolve(name)).split(path.sep).join('/');
    for (const m of result.mutants.filter(isStaticIgnored)) ranges.push(`${relative}:${m.location.start.line}-${m.location.end.line}`);
  }
  if (ranges.length) {
    console.log(`\n== ${target}: the static mutants (${ranges.length}), each test file with its own modules`);
    stryker(target, `${slug}-static`, tests, { LONGTAIL_MUTATION_ISOLATE: '1', LONGTAIL_MUTATION_RANGES: [...new Set(ranges)].join(',') });
  }
}

// Score per folder from every report under reports/mutation/ that was made from a file as it is
// now (its source in the report equals the file): each mutant (mutator, place, replacement)
// counts once, from the newest report that ran it; a static mutant the shared pass left alone
// counts from the isolated pass that ran it, and as "static, not run" until one has.
const root = 'reports/mutation';
const byFile = new Map();
for (const dir of existsSync(root) ? readdirSync(root) : []) {
  const file = path.join(root, dir, 'mutation.json');
  if (!existsSync(file)) continue;
  const when = statSync(file).mtimeMs;
  const report = JSON.parse(readFileSync(file, 'utf8'));
  for (const [name, result] of Object.entries(report.files)) {
    const relative = path.relative(process.cwd(), path.resolve(name)).split(path.sep).join('/');
    if (!existsSync(relative) || readFileSync(relative, 'utf8') !== result.source) continue;
    const mutants = byFile.get(relative) ?? new Map();
    byFile.set(relative, mutants);
    for (const m of result.mutants) {
      const { start, end } = m.location;
      const key = `${m.mutatorName}|${start.line}:${start.column}-${end.line}:${end.column}|${m.replacement ?? ''}`;
      const seen = mutants.get(key);
      const better = !seen || (isStaticIgnored(seen.m) && !isStaticIgnored(m)) || (isStaticIgnored(seen.m) === isStaticIgnored(m) && seen.when < when);
      if (better) mutants.set(key, { when, m });
    }
  }
}
const newest = new Map([...byFile].map(([file, mutants]) => [file, { mutants: [...mutants.values()].map((x) => x.m) }]));

const rows = FOLDERS.map(({ folder, target }) => {
  const count = { Killed: 0, Survived: 0, NoCoverage: 0, Timeout: 0, Ignored: 0, static: 0, errors: 0, files: 0 };
  for (const [file, { mutants }] of newest) {
    if (folderOf(file)?.folder !== folder) continue;
    count.files += 1;
    for (const m of mutants) {
      if (isStaticIgnored(m)) count.static += 1;
      else if (m.status in count) count[m.status] += 1;
      else count.errors += 1;
    }
  }
  const detected = count.Killed + count.Timeout;
  const valid = detected + count.Survived + count.NoCoverage;
  const score = valid ? (100 * detected) / valid : null;
  const all = readdirSync(folder, { recursive: true }).filter((f) => /\.ts$/.test(f) && !/\.d\.ts$/.test(f)).length;
  return { folder, ...count, all, score, target };
});

const pad = (value, width) => String(value).padStart(width);
console.log('\nMutation score per folder (reports/mutation/*/mutation.json)');
console.log(
  `${'folder'.padEnd(18)}${pad('files', 8)}${pad('killed', 8)}${pad('survived', 10)}${pad('no cover', 10)}${pad('timeout', 9)}${pad('ignored', 9)}${pad('static, not run', 17)}${pad('score', 9)}${pad('target', 8)}`,
);
for (const r of rows) {
  const score = r.score === null ? '—' : `${r.score.toFixed(1)} %`;
  const verdict = r.score === null ? 'not run' : r.score >= r.target ? 'ok' : 'below';
  console.log(
    `${r.folder.padEnd(18)}${pad(`${r.files}/${r.all}`, 8)}${pad(r.Killed, 8)}${pad(r.Survived, 10)}${pad(r.NoCoverage, 10)}${pad(r.Timeout, 9)}${pad(r.Ignored, 9)}${pad(r.static, 17)}${pad(score, 9)}${pad(`${r.target} %`, 8)}  ${verdict}`,
  );
}
