/**
 * Writes docs/spec-csv-columns.md, the column table of the spec CSV, from the spec schema
 * (`npm run generate:csv-columns` after changing shared/schema/spec.schema.json);
 * spec-columns.test.ts fails until you do.
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { specCsvColumnsMarkdown } from '#shared/import/spec-columns';

export const COLUMNS_DOC_PATH = fileURLToPath(new URL('../docs/spec-csv-columns.md', import.meta.url));

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  writeFileSync(COLUMNS_DOC_PATH, specCsvColumnsMarkdown());
  console.log(`Wrote ${COLUMNS_DOC_PATH}`);
}
