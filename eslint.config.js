// Lint: the recommended JavaScript and TypeScript rules, and the import boundaries between the
// layers (see DEVELOPERS.md, "Where things live"):
//   shared <- rules <- api, and shared <- web; nothing points back up.
//   web/src: routes compose features; a feature never imports another feature; the shared UI
//   (components/) and helpers (lib/) never import a feature; routes never import app/.
// tests/ may import anything. `npm run lint` runs this; `npm test` runs it after the type check.
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import js from '@eslint/js';
import { createNodeResolver, importX } from 'eslint-plugin-import-x';
import globals from 'globals';
import { defineConfig } from 'eslint/config';
import tseslint from 'typescript-eslint';

const root = dirname(fileURLToPath(import.meta.url));
const featuresDir = 'web/src/features';
const features = readdirSync(join(root, featuresDir), { withFileTypes: true })
  .filter((entry) => entry.isDirectory())
  .map((entry) => entry.name);

/** The allowed direction of every import between the layers, as import-x zones (target may not import from). */
const boundaryZones = [
  { target: './shared', from: ['./rules', './api', './web'], message: 'shared/ is the bottom layer: it imports neither rules/, api/ nor web/.' },
  { target: './rules', from: ['./api', './web'], message: 'rules/ imports only shared/.' },
  { target: './api', from: ['./web'], message: 'api/ imports shared/ and rules/, never web/.' },
  { target: './web', from: ['./api', './rules'], message: 'web/ imports shared/, never api/ or rules/ (the wire contract lives in shared/).' },
  ...features.map((feature) => ({
    target: `./${featuresDir}/${feature}`,
    from: `./${featuresDir}`,
    except: [`./${feature}`],
    message: 'A feature never imports another feature: move what both need to web/src/components or web/src/lib, or let the route compose the two.',
  })),
  { target: ['./web/src/components', './web/src/lib'], from: `./${featuresDir}`, message: 'Shared UI (components/) and helpers (lib/) never import a feature.' },
  { target: './web/src/routes', from: './web/src/app', message: 'Routes never import app/ (the router imports the routes).' },
];

export default defineConfig(
  // Generated files are checked by the generator's drift test, not by hand-written rules.
  { ignores: ['node_modules/', 'dist/', 'coverage/', 'tmp/', 'test-results/', 'screenshots/', 'data/', '**/*.generated.ts'] },
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node } },
    rules: {
      // A leading underscore marks a value kept on purpose (an unused parameter, a field dropped by destructuring).
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' }],
      // User text is checked for control characters on purpose (shared/text/plain-text.ts and its tests).
      'no-control-regex': 'off',
    },
  },
  {
    // Tests build loose JSON bodies and small hand parsers.
    files: ['tests/**'],
    rules: { '@typescript-eslint/no-explicit-any': 'off', '@typescript-eslint/no-unused-expressions': 'off' },
  },
  {
    files: ['web/**'],
    languageOptions: { globals: { ...globals.browser } },
  },
  {
    files: ['shared/**', 'rules/**', 'api/**', 'web/**'],
    plugins: { 'import-x': importX },
    settings: {
      'import-x/resolver-next': [createNodeResolver({ extensions: ['.ts', '.tsx', '.mts', '.js', '.mjs', '.json'] })],
    },
    rules: {
      'import-x/no-restricted-paths': ['error', { basePath: root, zones: boundaryZones }],
    },
  },
);
