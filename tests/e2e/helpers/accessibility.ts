/**
 * checkAccessibility(page, label): axe-core (the installed axe-core package, injected into the
 * page) over the whole document; throws when any violation is 'serious' or 'critical', listing
 * each one's rule id, help text, help URL and the offending elements. Lesser violations are
 * printed, not failed. Throws a plain Error (no vitest import), so the benchmark may use it too.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';

const require = createRequire(import.meta.url);
const AXE_PATH = require.resolve('axe-core/axe.min.js');
let axeSource: string | null = null;

interface AxeNode {
  target: unknown[];
  failureSummary?: string;
}
interface AxeViolation {
  id: string;
  impact: 'minor' | 'moderate' | 'serious' | 'critical' | null;
  help: string;
  helpUrl: string;
  nodes: AxeNode[];
}

const BLOCKING = new Set(['serious', 'critical']);

function describe(violation: AxeViolation): string {
  const targets = violation.nodes.slice(0, 8).map((n) => `      ${JSON.stringify(n.target)}${n.failureSummary ? `\n        ${n.failureSummary.replace(/\n/g, '\n        ')}` : ''}`);
  const more = violation.nodes.length > 8 ? [`      … and ${violation.nodes.length - 8} more`] : [];
  return [`  [${violation.impact}] ${violation.id}: ${violation.help} (${violation.helpUrl})`, ...targets, ...more].join('\n');
}

export async function checkAccessibility(page: Page, label: string): Promise<AxeViolation[]> {
  const present = await page.evaluate(() => typeof (window as unknown as { axe?: unknown }).axe !== 'undefined');
  if (!present) {
    // page.addScriptTag({ path }) adds an inline <script>, which the app's CSP (script-src 'self')
    // refuses; evaluating the same source through the DevTools protocol is not subject to the
    // CSP, so the app is checked with its real policy in force.
    axeSource ??= readFileSync(AXE_PATH, 'utf8');
    await page.evaluate(axeSource);
  }
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (context: Document, options: object) => Promise<{ violations: unknown[] }> } }).axe;
    const results = await axe.run(document, { resultTypes: ['violations'] });
    return results.violations;
  }) as AxeViolation[];
  const blocking = violations.filter((v) => v.impact !== null && BLOCKING.has(v.impact));
  const lesser = violations.filter((v) => !blocking.includes(v));
  if (lesser.length > 0) console.log(`axe, ${label}: ${lesser.length} lesser violation(s), not failed:\n${lesser.map(describe).join('\n')}`);
  if (blocking.length > 0) {
    throw new Error(`axe found ${blocking.length} serious or critical violation(s) on ${label} (${page.url()}):\n${blocking.map(describe).join('\n')}`);
  }
  return violations;
}
