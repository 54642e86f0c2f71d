/**
 * Stored spec versions read as today's schema: the resistor tolerance moves from a fraction
 * (`resistors.tolerance`, 0.01) to per cent (`resistors.tolerancePercent`, 1), the same
 * conversion validateSpec applies to older documents; and titles and device-model names lose
 * control characters, line and paragraph separators and bidi controls (each becomes a blank,
 * `singleLine`), which the API refuses today, so every stored version still validates when it is
 * ranked, checked or verified again. Data only: the query builder, no SQL dialect, so SQLite and
 * PostgreSQL run the same code. `down` writes the fraction back (titles stay cleaned).
 */
import type { MigrationInterface, QueryRunner } from 'typeorm';
import { singleLine } from '#shared/text/plain-text';
import { fractionToPercent } from '#shared/validation/spec-upgrade';

type Row = { id: number; title: string; payload: string };
type Payload = { title?: unknown; deviceModel?: { name?: unknown }; resistors?: Record<string, unknown> };

const clean = (text: string) => singleLine(text).trim() || 'Untitled spec';

/** The payload as today's schema has it, or null when nothing changes. */
function upgraded(payload: Payload): Payload | null {
  let changed = false;
  const resistors = payload.resistors;
  if (resistors && typeof resistors.tolerance === 'number' && resistors.tolerancePercent === undefined) {
    const { tolerance, ...rest } = resistors;
    payload.resistors = { ...rest, tolerancePercent: fractionToPercent(tolerance as number) };
    changed = true;
  }
  if (typeof payload.title === 'string' && clean(payload.title) !== payload.title) {
    payload.title = clean(payload.title);
    changed = true;
  }
  const model = payload.deviceModel;
  if (model && typeof model.name === 'string' && singleLine(model.name) !== model.name) {
    model.name = singleLine(model.name);
    changed = true;
  }
  return changed ? payload : null;
}

function downgraded(payload: Payload): Payload | null {
  const resistors = payload.resistors;
  if (!resistors || typeof resistors.tolerancePercent !== 'number') return null;
  const { tolerancePercent, ...rest } = resistors;
  payload.resistors = { ...rest, tolerance: Number(((tolerancePercent as number) / 100).toPrecision(12)) };
  return payload;
}

async function rewrite(queryRunner: QueryRunner, change: (payload: Payload) => Payload | null, titles: boolean): Promise<void> {
  const manager = queryRunner.manager;
  const versions: Row[] = await manager.createQueryBuilder().select(['v.id AS id', 'v.title AS title', 'v.payload AS payload']).from('spec_version', 'v').getRawMany();
  for (const row of versions) {
    const payload = change(JSON.parse(row.payload) as Payload);
    const title = titles ? clean(row.title) : row.title;
    if (!payload && title === row.title) continue;
    // Plain SQL, not an update through the query builder: that would find the entity of the
    // table (loaded beside the migrations) and pass the text through its JSON column transformer.
    const [sql, values] = queryRunner.connection.driver.escapeQueryWithParameters(
      `UPDATE spec_version SET title = :title, payload = :payload WHERE id = :id`,
      { title, payload: payload ? JSON.stringify(payload) : row.payload, id: row.id },
    );
    await queryRunner.query(sql, values);
  }
  if (!titles) return;
  const specs: { id: number; title: string }[] = await manager.createQueryBuilder().select(['s.id AS id', 's.title AS title']).from('spec', 's').getRawMany();
  for (const row of specs) {
    if (clean(row.title) === row.title) continue;
    await manager.createQueryBuilder().update('spec').set({ title: clean(row.title) }).where('id = :id', { id: row.id }).execute();
  }
}

export class SpecTextAndTolerance1764800000000 implements MigrationInterface {
  name = 'SpecTextAndTolerance1764800000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await rewrite(queryRunner, upgraded, true);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await rewrite(queryRunner, downgraded, false);
  }
}
