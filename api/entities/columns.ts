/**
 * Column helpers shared by the entity schemas. Types are portable (integer, varchar, text,
 * boolean): timestamps are ISO-8601 strings (they sort as text) and JSON documents are text,
 * so the same schema runs on SQLite and PostgreSQL.
 */
import type { EntitySchemaColumnOptions } from 'typeorm';

export const idColumn: EntitySchemaColumnOptions = { type: 'integer', primary: true, generated: 'increment' };
export const foreignKeyColumn = (name: string, nullable = false): EntitySchemaColumnOptions => ({ type: 'integer', name, nullable });
export const timestampColumn = (name: string): EntitySchemaColumnOptions => ({ type: 'varchar', length: 32, name });
export const textColumn = (nullable = false): EntitySchemaColumnOptions => ({ type: 'text', nullable });
export const shortTextColumn = (length: number, nullable = false): EntitySchemaColumnOptions => ({ type: 'varchar', length, nullable });
