/**
 * Checks stored before the rule files carried their metadata get it: every check in a stored
 * ranking (`ranking.result`) and in an override's stored evaluation (`decision.evaluation`) that
 * has no `title`, `kind` and `figure` gains them from the rule of the same id. Nothing else in
 * the record changes: no figure, margin, verdict, reason or version. Without this, the app and
 * the report would show such a check by its id and could not tell a hazard caution (printed once,
 * under Cautions) from an advisory check.
 *
 * The metadata is frozen here as the rule files gave it when this migration was written (a
 * migration must give the same result whenever it runs, whatever the rule files say later).
 * A ranking's content hash is recomputed from its new text; a check of a rule id not listed is
 * left as it is. Portable plain SQL with named parameters.
 */
import { createHash } from 'node:crypto';
import type { MigrationInterface, QueryRunner } from 'typeorm';

type Kind = 'blocking' | 'advisory' | 'caution';

/** rules/<id>.json's title, kind and figure for every rule that existed before this migration. */
export const RULE_METADATA_AT_MIGRATION: Readonly<Record<string, { title: string; kind: Kind; figure: string | null }>> = {
  'cmrr-differential-worst-case': { title: 'Rejection, mismatch worst case', kind: 'advisory', figure: 'cmrrDifferentialWorstCaseDb' },
  'cmrr-target': { title: 'Rejection, tail-limited', kind: 'blocking', figure: 'cmrrAtFrequencyDb' },
  'cmrr-yield': { title: 'Monte Carlo yield', kind: 'blocking', figure: 'monteCarloYieldPercent' },
  'gain-over-conditions': { title: 'Gain over temperature and input range', kind: 'blocking', figure: 'gainWorstCornerErrorPercent' },
  'gain-tolerance': { title: 'Gain within tolerance (nominal)', kind: 'blocking', figure: 'gainPredicted' },
  'gain-vs-common-mode': { title: 'Gain across input common mode', kind: 'blocking', figure: 'gainVsCommonModePercent' },
  'hazardous-voltage': { title: 'Rail voltage', kind: 'caution', figure: 'railSpanV' },
  'input-common-mode-high': { title: 'Input common mode, high end', kind: 'blocking', figure: 'icmHighMarginV' },
  'input-common-mode-low': { title: 'Input common mode, low end', kind: 'blocking', figure: 'icmLowMarginV' },
  'mains-referenced': { title: 'Mains-referenced input', kind: 'caution', figure: null },
  'operating-point': { title: 'Operating point', kind: 'blocking', figure: 'operatingPointProblemCount' },
  'output-swing': { title: 'Output swing', kind: 'blocking', figure: 'swingMarginV' },
  'patient-connected': { title: 'Patient-connected input', kind: 'caution', figure: null },
  'power-budget': { title: 'Power budget', kind: 'blocking', figure: 'powerWorstW' },
  'tail-current-drift': { title: 'Tail current drift', kind: 'advisory', figure: 'tailCurrentDriftPercent' },
};

const BATCH = 100;

async function run<T = unknown>(queryRunner: QueryRunner, sql: string, parameters: Record<string, unknown>): Promise<T> {
  const [text, values] = queryRunner.connection.driver.escapeQueryWithParameters(sql, parameters);
  return queryRunner.query(text, values) as Promise<T>;
}

type StoredCheck = { rule?: unknown; title?: unknown; kind?: unknown; figure?: unknown };

/** Adds the missing metadata to each check of a list; true when one changed. */
function completeChecks(checks: unknown): boolean {
  if (!Array.isArray(checks)) return false;
  let changed = false;
  for (const check of checks as StoredCheck[]) {
    if (!check || typeof check !== 'object' || typeof check.rule !== 'string') continue;
    const meta = RULE_METADATA_AT_MIGRATION[check.rule];
    if (!meta) continue;
    for (const key of ['title', 'kind', 'figure'] as const) {
      if (check[key] !== undefined) continue;
      check[key] = meta[key];
      changed = true;
    }
  }
  return changed;
}

/** A stored ranking's text with its checks completed, or null when nothing changed (or it is not JSON). */
export function completedRanking(text: string): string | null {
  let ranking: { options?: { checks?: unknown }[] };
  try {
    ranking = JSON.parse(text) as typeof ranking;
  } catch {
    return null;
  }
  let changed = false;
  for (const option of Array.isArray(ranking?.options) ? ranking.options : []) changed = completeChecks(option?.checks) || changed;
  return changed ? JSON.stringify(ranking) : null;
}

/** A stored override evaluation's text with its checks completed, or null when nothing changed. */
export function completedEvaluation(text: string): string | null {
  let evaluation: { checks?: unknown } | null;
  try {
    evaluation = JSON.parse(text) as typeof evaluation;
  } catch {
    return null;
  }
  return evaluation && completeChecks(evaluation.checks) ? JSON.stringify(evaluation) : null;
}

export class CheckMetadata1764900100000 implements MigrationInterface {
  name = 'CheckMetadata1764900100000';

  async up(queryRunner: QueryRunner): Promise<void> {
    for (let last = 0; ; ) {
      const rows = await run<{ id: number; result: string }[]>(queryRunner, `SELECT id, result FROM ranking WHERE id > :last ORDER BY id LIMIT ${BATCH}`, { last });
      if (rows.length === 0) break;
      for (const row of rows) {
        const text = completedRanking(row.result);
        if (text === null) continue;
        const hash = createHash('sha256').update(text, 'utf8').digest('hex');
        await run(queryRunner, 'UPDATE ranking SET result = :text, content_hash = :hash WHERE id = :id', { text, hash, id: Number(row.id) });
      }
      last = Number(rows.at(-1)!.id);
    }
    for (let last = 0; ; ) {
      const rows = await run<{ id: number; evaluation: string }[]>(queryRunner, `SELECT id, evaluation FROM decision WHERE id > :last AND evaluation IS NOT NULL ORDER BY id LIMIT ${BATCH}`, { last });
      if (rows.length === 0) break;
      for (const row of rows) {
        const text = completedEvaluation(row.evaluation);
        if (text !== null) await run(queryRunner, 'UPDATE decision SET evaluation = :text WHERE id = :id', { text, id: Number(row.id) });
      }
      last = Number(rows.at(-1)!.id);
    }
  }

  /** The added metadata is harmless to the code before it (it ignores unknown fields): nothing to undo. */
  async down(): Promise<void> {}
}
