/**
 * `npm start` until the server lands: ranks the tail options of every demo spec and prints a
 * readable table per spec (the JSON for any spec: `npm run --silent longtail -- recommend FILE`).
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { recommend } from '#shared/engine/index';
import { formatDb } from '#shared/units/figures';
import { formatQuantity } from '#shared/units/index';
import { formatIssue, validateSpec } from '#shared/validate';
import { loadRuleSet } from '../rules/index';

const specsDir = join(fileURLToPath(new URL('.', import.meta.url)), 'demo', 'specs');
const ruleSet = await loadRuleSet();

for (const file of readdirSync(specsDir).filter((f) => f.endsWith('.json')).sort()) {
  const checked = validateSpec(JSON.parse(readFileSync(join(specsDir, file), 'utf8')));
  if (!checked.ok) {
    console.log(`${file}: ${checked.errors.map(formatIssue).join('; ')}`);
    continue;
  }
  const spec = checked.value;
  const result = await recommend(spec, ruleSet);
  console.log(`\n${spec.title}  (api/demo/specs/${file})`);
  console.log(`  ${result.summary}`);
  for (const caution of result.cautions) console.log(`  ! ${caution}`);
  console.log('  rank  topology             passes  tail |Z| at f   rejection  gain     tail current  power     failed checks');
  for (const o of result.options) {
    const failed = o.checks.filter((c) => !c.passed).map((c) => `${c.rule}${c.severity === 'advisory' ? ' (advisory)' : ''}`);
    console.log(
      `  ${String(o.rank).padEnd(5)} ${o.topology.padEnd(20)} ${(o.passes ? 'yes' : 'no').padEnd(7)} ${formatQuantity(o.figures?.tailImpedanceAtFrequencyOhm ?? NaN, 'Ohm').padEnd(15)} ${(o.rejectionDb === null ? '—' : formatDb(o.rejectionDb)).padEnd(10)} ${(o.figures ? `${o.figures.gainPredicted.toFixed(2)}` : '—').padEnd(8)} ${formatQuantity(o.predicted?.tailCurrentA ?? NaN, 'A').padEnd(13)} ${formatQuantity(o.figures?.powerWorstW ?? NaN, 'W').padEnd(9)} ${failed.join(', ') || '—'}`,
    );
  }
  console.log(`  ${result.notice}`);
}
