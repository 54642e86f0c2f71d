// Compiles the server and the command line into dist/server for a production start (no tsx, no
// devDependencies at run time). esbuild bundles our own TypeScript (shared/, rules/, api/) into
// one file per entry and leaves every npm package as an import, so `npm ci --omit=dev` supplies
// them.
//
// Our modules find their data files beside their source (the rule files, the demo specs and
// device cards, the SPICE thread's script): `import.meta.url` in a bundle would name the bundle
// instead. So each source file's `import.meta.url` is replaced by the address of that source file,
// worked out at run time from the bundle's own address; the package ships those data files in
// place (package.json "files").
import { build } from 'esbuild';
import { readFile } from 'node:fs/promises';
import { dirname, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const outdir = resolve(root, 'dist/server');

/** `import.meta.url` of each of our source files, as seen from the bundle in dist/server. */
const sourceAddresses = {
  name: 'source-addresses',
  setup(builder) {
    builder.onLoad({ filter: /\.(ts|tsx|mts)$/ }, async (args) => {
      if (args.path.includes('/node_modules/')) return undefined;
      const text = await readFile(args.path, 'utf8');
      if (!text.includes('import.meta.url')) return { contents: text, loader: 'ts' };
      const fromBundle = relative(outdir, args.path).split('\\').join('/');
      const address = `new URL(${JSON.stringify(fromBundle)}, import.meta.url).href`;
      return { contents: text.replaceAll('import.meta.url', `(${address})`), loader: 'ts' };
    });
  },
};

const started = Date.now();
await build({
  absWorkingDir: root,
  // engine-tasks: what the engine's worker threads run (api/engine/engine-worker.mjs loads it from here when the sources are not there)
  entryPoints: { server: 'api/server.ts', longtail: 'api/cli.ts', 'engine-tasks': 'api/engine/engine-tasks.ts' },
  outdir,
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  packages: 'external',
  sourcemap: true,
  logLevel: 'warning',
  plugins: [sourceAddresses],
  // Bundled CommonJS helpers (none today) would need require in an ES module.
  banner: { js: "import { createRequire as __longtailRequire } from 'node:module'; const require = __longtailRequire(import.meta.url);" },
});
console.log(`Compiled the server into ${relative(root, outdir)}/ in ${Date.now() - started} ms`);
