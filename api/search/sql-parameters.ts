/**
 * Parameters of a hand-written statement, numbered for the back end (`?` on SQLite, `$n` on
 * PostgreSQL): every value a statement uses goes through `add`, never into its text. (The same
 * rule as data-source.ts's sqlParameter, without importing it: the search-index migration uses
 * this, and data-source.ts imports every migration.)
 */
import type { DataSource } from 'typeorm';

export class SqlParameters {
  readonly values: unknown[] = [];

  constructor(private readonly dataSource: DataSource) {}

  /** The placeholder of one more value. */
  add(value: unknown): string {
    this.values.push(value);
    return this.dataSource.options.type === 'postgres' ? `$${this.values.length}` : '?';
  }

  /** Placeholders of a list of values, comma-separated (for `IN (...)`; the list must not be empty). */
  list(values: readonly unknown[]): string {
    if (values.length === 0) throw new Error('An empty list has no placeholders');
    return values.map((value) => this.add(value)).join(', ');
  }
}
