/**
 * JSON documents stored as text (portable: SQLite and PostgreSQL alike), read and written as
 * values: the one place a column's JSON is parsed and serialised. Entities declare the document's
 * type; services read and write objects. Raw SQL (migrations, query builders' raw selects) still
 * sees the text.
 */
import type { EntitySchemaColumnOptions, ValueTransformer } from 'typeorm';

export const jsonTransformer: ValueTransformer = {
  // undefined stays undefined (a column left out of an update or a find condition).
  to: (value: unknown) => (value === undefined ? undefined : value === null ? null : JSON.stringify(value)),
  from: (text: string | null | undefined) => (text === null || text === undefined ? text : JSON.parse(text)),
};

/** A text column holding one JSON document. */
export const jsonColumn = (nullable = false): EntitySchemaColumnOptions => ({ type: 'text', nullable, transformer: jsonTransformer });
