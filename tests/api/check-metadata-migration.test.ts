/**
 * Checks stored before the rule files carried their title, kind and figure, on a database written
 * before the migration that completes them (SQLite here, PostgreSQL in the api-postgres project):
 * a stored ranking and an override's stored evaluation whose checks lack the three fields, then the
 * server opened as on an upgrade. Every check must gain its rule's metadata (the hazard rules as
 * cautions: the rail voltage, patient-connected and mains-referenced inputs are the product's
 * safety cautions, README), nothing else in the record may change, and the ranking's key must be
 * the SHA-256 of its new text.
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { DataSource } from 'typeorm';
import { createDataSource, openDatabase } from '../../api/data-source';
import { MIGRATIONS } from '../../api/migrations/index';
import { CheckMetadata1764900100000, RULE_METADATA_AT_MIGRATION } from '../../api/migrations/1764900100000-check-metadata';
import { getProposal } from '../../api/services/proposals.service';
import { checkedSpecDocument } from '../../api/services/specs.service';
import { ENGINE_VERSION, evaluateDesign, recommend } from '#shared/engine/index';
import { loadRuleSet } from '../../rules/index';
import { freshDatabase, type TestDatabase } from '../helpers/test-database';

const AT = '2026-11-20T10:00:00.000Z';
const PAYLOAD = {
  title: 'Tarnbeck strain receiver',
  device: { beta: 190, earlyVoltageV: 85, saturationCurrentA: 6e-15 },
  supply: { positiveV: 36, negativeV: -36 },
  gain: { target: 12, output: 'differential' },
  cmrr: { minDb: 70, atFrequencyHz: 1000 },
  topologies: ['resistor', 'simple-mirror', 'wilson'],
  hazards: { patientConnected: true, mainsReferenced: false },
  monteCarlo: { samples: 100, seed: 3 },
};
const CAUTION_RULES = ['hazardous-voltage', 'patient-connected', 'mains-referenced'];

type Check = Record<string, unknown> & { rule: string };
type Ranking = { options: { checks: Check[] }[] };
const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');
const strip = (checks: Check[]) => checks.forEach((check) => ['title', 'kind', 'figure'].forEach((key) => delete check[key]));

let database: TestDatabase;
let upgraded: DataSource;
let oldRanking: Ranking;
let oldEvaluation: { checks: Check[] };
/**
 * The rules' metadata as the migration froze it (their files when it was written): a check stored
 * before the migration was made by those rules, so it must gain exactly that, whatever the rule
 * files say today (a rule retitled since keeps its old title on old records).
 */
const ruleFiles = new Map(Object.entries(RULE_METADATA_AT_MIGRATION));
/** Only rules that existed before the migration can have made a stored check. */
const keepRulesOfThen = (checks: Check[]) => checks.filter((check) => ruleFiles.has(check.rule));

beforeAll(async () => {
  const ruleSet = await loadRuleSet();
  const document = checkedSpecDocument(PAYLOAD);
  oldRanking = JSON.parse(JSON.stringify(await recommend(document, ruleSet))) as Ranking;
  oldRanking.options.forEach((option) => {
    option.checks = keepRulesOfThen(option.checks);
    strip(option.checks);
  });
  oldEvaluation = JSON.parse(JSON.stringify(await evaluateDesign(document, (oldRanking.options[0] as unknown as { design: never }).design, ruleSet))) as { checks: Check[] };
  oldEvaluation.checks = keepRulesOfThen(oldEvaluation.checks);
  strip(oldEvaluation.checks);
  const rankingText = JSON.stringify(oldRanking);

  database = await freshDatabase({ reopenable: true });
  const old = createDataSource(database.location);
  old.setOptions({ migrations: MIGRATIONS.slice(0, MIGRATIONS.indexOf(CheckMetadata1764900100000)), entities: [] });
  await old.initialize();
  await old.runMigrations();
  const insert = (table: string, values: Record<string, unknown>) => old.createQueryBuilder().insert().into(table).values(values).execute();
  await insert('user_account', { email: 'odile@upgrade.test', display_name: 'Odile Marchetti', role: 'member', password_hash: 'x', created_at: AT });
  await insert('project', { name: 'Tarnbeck', description: '', created_by_id: 1, created_at: AT });
  await insert('project_member', { project_id: 1, user_id: 1, role: 'designer', created_at: AT });
  await insert('spec', { project_id: 1, title: PAYLOAD.title, latest_version: 1, created_by_id: 1, created_at: AT, updated_at: AT });
  await insert('spec_version', { spec_id: 1, version: 1, title: PAYLOAD.title, payload: JSON.stringify(document), created_by_id: 1, created_at: AT });
  await insert('ranking', { content_hash: sha256(rankingText), result: rankingText, created_at: AT });
  await insert('proposal', {
    project_id: 1, spec_id: 1, spec_version_id: 1, engine_version: ENGINE_VERSION, ruleset_version: 'before-metadata',
    recommended_topology: null, status: 'decided', created_by_id: 1, created_at: AT, updated_at: AT, ranking_id: 1,
  });
  await insert('decision', {
    proposal_id: 1, kind: 'override', topology: 'resistor', design: JSON.stringify((oldRanking.options[0] as unknown as { design: unknown }).design),
    evaluation: JSON.stringify(oldEvaluation), reason: 'Board space', decided_by_id: 1, created_at: AT,
  });
  await old.destroy();
  upgraded = await openDatabase(database.location);
});

afterAll(async () => {
  if (upgraded?.isInitialized) await upgraded.destroy();
  await database?.drop();
});

describe('when a database whose stored checks carry no rule metadata is opened', () => {
  test('then every check of the stored ranking carries its rule file’s title, kind and figure', async () => {
    const [row] = await upgraded.query('SELECT content_hash, result FROM ranking');
    const ranking = JSON.parse(row.result) as Ranking;
    const checks = ranking.options.flatMap((option) => option.checks);
    expect(checks.length).toBeGreaterThan(0);
    for (const check of checks) {
      const rule = ruleFiles.get(check.rule)!;
      expect({ title: check.title, kind: check.kind, figure: check.figure }, check.rule).toEqual({ title: rule.title, kind: rule.kind, figure: rule.figure });
    }
    expect(new Set(checks.filter((check) => check.kind === 'caution').map((check) => check.rule))).toEqual(new Set(CAUTION_RULES));
    expect(row.content_hash).toBe(sha256(row.result));
  });

  test('then nothing else in the stored ranking changed', async () => {
    const [row] = await upgraded.query('SELECT result FROM ranking');
    const ranking = JSON.parse(row.result) as Ranking;
    ranking.options.forEach((option) => strip(option.checks));
    expect(ranking).toEqual(oldRanking);
  });

  test('then the override’s stored evaluation is completed the same way, and nothing else changed', async () => {
    const [row] = await upgraded.query('SELECT evaluation FROM decision');
    const evaluation = JSON.parse(row.evaluation) as { checks: Check[] };
    for (const check of evaluation.checks) expect(check.title, check.rule).toBe(ruleFiles.get(check.rule)!.title);
    strip(evaluation.checks);
    expect(evaluation).toEqual(oldEvaluation);
  });

  test('then the proposal is answered with the completed checks', async () => {
    const proposal = await getProposal(upgraded, { id: 1, role: 'member' }, 1);
    const cautions = proposal.result.options[0].checks.filter((check) => check.kind === 'caution').map((check) => check.rule);
    expect(new Set(cautions)).toEqual(new Set(CAUTION_RULES));
  });
});
