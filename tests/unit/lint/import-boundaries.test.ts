/**
 * The import boundaries of eslint.config.js, checked through ESLint's own Node API on small files
 * linted in memory at paths inside the repository (nothing is written), so the boundary
 * configuration cannot rot silently: a zone that stopped matching, a resolver that stopped
 * finding `.ts` files (the rule skips imports it cannot resolve) or a new feature folder left out
 * would let these crossings through. The layers are the ones DEVELOPERS.md draws: shared <- rules
 * <- api, shared <- web; inside web/src a feature never imports another feature, components/ and
 * lib/ never import a feature, routes never import app/; tests/ may import anything.
 */
import { readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { ESLint } from 'eslint';
import { beforeAll, describe, expect, test } from 'vitest';

const REPO_ROOT = fileURLToPath(new URL('../../../', import.meta.url));
const RULE = 'import-x/no-restricted-paths';

let eslint: ESLint;
beforeAll(() => {
  eslint = new ESLint({ cwd: REPO_ROOT });
});

/** The boundary messages ESLint reports for `code` placed at `filePath` (relative to the repository). */
async function boundaryErrors(filePath: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: `${REPO_ROOT}${filePath}` });
  const fatal = result.messages.filter((m) => m.fatal);
  expect(fatal, 'the probe file must parse').toEqual([]);
  return result.messages.filter((m) => m.ruleId === RULE).map((m) => m.message);
}

describe('import boundaries (eslint.config.js)', () => {
  test('a feature importing another feature fails lint, statically and lazily', async () => {
    const file = 'web/src/features/measurements/components/boundary-probe.tsx';
    const errors = await boundaryErrors(
      file,
      [
        "import { histogramPlot } from '../../proposals/lib/plot-data';",
        "export const probe = histogramPlot;",
        "export const later = () => import('../../specs/lib/spec-rows');",
      ].join('\n'),
    );
    expect(errors).toHaveLength(2);
    expect(errors[0]).toContain('"../../proposals/lib/plot-data"');
    expect(errors[0]).toContain('A feature never imports another feature');
    expect(errors[1]).toContain('"../../specs/lib/spec-rows"');
  });

  test('every feature folder is fenced off from every other one', async () => {
    const features = readdirSync(`${REPO_ROOT}web/src/features`, { withFileTypes: true })
      .filter((entry) => entry.isDirectory())
      .map((entry) => entry.name);
    expect(features.length).toBeGreaterThan(2);
    for (const [i, feature] of features.entries()) {
      const other = features[(i + 1) % features.length];
      // A real module of the other feature: the rule only judges imports it can resolve.
      const real = readdirSync(`${REPO_ROOT}web/src/features/${other}`, { recursive: true, encoding: 'utf8' }).find((name) => /\.tsx?$/.test(name))!;
      const module = real.replace(/\.tsx?$/, '');
      const crossing = await boundaryErrors(`web/src/features/${feature}/boundary-probe.ts`, `export * from '../${other}/${module}';\n`);
      expect(crossing, `${feature} -> ${other}/${module}`).toHaveLength(1);
    }
  });

  test('a feature may import its own files, components/, lib/ and shared/', async () => {
    const errors = await boundaryErrors(
      'web/src/features/measurements/components/boundary-probe.tsx',
      [
        "import { measurementPlot } from '../lib/measurement-plot';",
        "import { DenseTable } from '../../../components/ui/dense-table';",
        "import { formatDb } from '../../../lib/figure-format';",
        "import { formatQuantity } from '../../../../../shared/units/format-quantity';",
        'export const probe = [measurementPlot, DenseTable, formatDb, formatQuantity];',
      ].join('\n'),
    );
    expect(errors).toEqual([]);
  });

  test('shared UI and helpers never import a feature', async () => {
    const line = (depth: string) => `import { specGroups } from '${depth}/features/specs/lib/spec-rows';\nexport const probe = specGroups;\n`;
    expect(await boundaryErrors('web/src/components/ui/boundary-probe.tsx', line('../..'))).toHaveLength(1);
    expect(await boundaryErrors('web/src/lib/boundary-probe.ts', line('..'))).toHaveLength(1);
  });

  test('routes compose several features but never import app/', async () => {
    const compose = [
      "import { MeasurementsPanel } from '../features/measurements/components/measurements-panel';",
      "import { SpecTable } from '../features/specs/components/spec-table';",
      'export const probe = [MeasurementsPanel, SpecTable];',
    ].join('\n');
    expect(await boundaryErrors('web/src/routes/boundary-probe.tsx', compose)).toEqual([]);
    const app = await boundaryErrors('web/src/routes/boundary-probe.tsx', "import { router } from '../app/router';\nexport const probe = router;\n");
    expect(app).toHaveLength(1);
    expect(app[0]).toContain('Routes never import app/');
  });

  test('the layers: shared <- rules <- api, shared <- web, nothing back up', async () => {
    const imports = (specifiers: string[]) => specifiers.map((s, i) => `import * as m${i} from '${s}';\nexport const p${i} = m${i};`).join('\n');
    // shared imports nothing above it.
    expect(await boundaryErrors('shared/boundary-probe.ts', imports(['../rules/index', '../api/errors', '../web/src/lib/cn']))).toHaveLength(3);
    // rules imports shared only.
    expect(await boundaryErrors('rules/boundary-probe.ts', imports(['../shared/validate', '../api/errors', '../web/src/lib/cn']))).toHaveLength(2);
    // api imports shared and rules, never web.
    expect(await boundaryErrors('api/boundary-probe.ts', imports(['../shared/validate', '../rules/index', '../web/src/lib/cn']))).toHaveLength(1);
    // web imports shared, never api or rules.
    expect(await boundaryErrors('web/src/lib/boundary-probe.ts', imports(['../../../shared/validate', '../../../api/errors', '../../../rules/index']))).toHaveLength(2);
  });

  test('tests may import anything', async () => {
    const errors = await boundaryErrors(
      'tests/unit/lint/boundary-probe.ts',
      "import * as a from '../../../api/errors';\nimport * as b from '../../../web/src/features/specs/lib/spec-rows';\nimport * as c from '../../../rules/index';\nexport const probe = [a, b, c];\n",
    );
    expect(errors).toEqual([]);
  });
});
