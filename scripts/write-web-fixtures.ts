/**
 * Writes the web component tests' engine fixtures, tests/web/fixtures/<name>.generated.json:
 * each invented spec of tests/web/fixtures/specs/ run through the real `recommend` with the
 * real rule set (`npm run generate:web-fixtures` after an engine or rule change);
 * tests/web/fixtures/web-fixtures.test.ts fails until you do. The output is deterministic:
 * the specs fix the Monte Carlo seed and the result holds no time. The bridge receiver states
 * tight sign-off spreads (rails ±0.2 %, BF 160–170, 10 ppm/°C resistors), as a bench instrument on
 * regulated rails would, so the sign-off corners leave its recommendation the degenerated mirror
 * the web tests walk through.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { recommend, type RecommendResult } from '#shared/engine/index';
import { validateSpec } from '#shared/validate';
import { loadRuleSet } from '../rules/index';

/**
 * Differential output, Monte Carlo, simplest-sufficient; single-ended, highest-rejection; the
 * trade-off targets (noise, bias current, slew rate, offset) with a window too narrow for noise and
 * bias at once; a gain held to ±2 % from −40 to 85 °C with the PTAT tail (and its PNP) among the options;
 * a PNP pair on a single 5 V supply whose input range reaches the negative rail.
 */
export const WEB_FIXTURES = ['bridge-receiver', 'line-receiver', 'hydrophone-preamp', 'geophone-node', 'pressure-probe'] as const;
export type WebFixtureName = (typeof WEB_FIXTURES)[number];

const FIXTURES_DIR = new URL('../tests/web/fixtures/', import.meta.url);
export const webFixtureSpecPath = (name: WebFixtureName) => fileURLToPath(new URL(`specs/${name}.json`, FIXTURES_DIR));
export const webFixturePath = (name: WebFixtureName) => fileURLToPath(new URL(`${name}.generated.json`, FIXTURES_DIR));

/** The engine's answer for one fixture spec. */
export async function webFixtureResult(name: WebFixtureName): Promise<RecommendResult> {
  const checked = validateSpec(JSON.parse(readFileSync(webFixtureSpecPath(name), 'utf8')));
  if (!checked.ok) throw new Error(`write-web-fixtures: ${name} does not validate: ${JSON.stringify(checked.errors)}`);
  return recommend(checked.value, await loadRuleSet());
}

/** The file text for one fixture. */
export async function webFixtureText(name: WebFixtureName): Promise<string> {
  return `${JSON.stringify(await webFixtureResult(name), null, 1)}\n`;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  for (const name of WEB_FIXTURES) {
    writeFileSync(webFixturePath(name), await webFixtureText(name));
    console.log(`Wrote ${webFixturePath(name)}`);
  }
}
