/**
 * rjsf's validator for the spec form: the precompiled ajv8 functions (no eval in the browser),
 * with the server's own wording of each problem (shared/validation/ajv-issues), so a message
 * reads the same whether the browser or the server found it.
 */
import type { ErrorObject } from 'ajv';
import type { RJSFSchema, ValidatorType } from '@rjsf/utils';
import { hashForSchema } from '@rjsf/utils';
// The module itself, not the package index: the index would bundle ajv's compiler for nothing
import createPrecompiledValidator from '@rjsf/validator-ajv8/lib/createPrecompiledValidator.js';
import { issuesFromAjvErrors } from '#shared/validation/ajv-issues';
import { SPEC_SCHEMA_HASH, SPEC_VALIDATORS } from './spec-validators.generated';

/** The served schema is not the one this build was compiled for (a release happened meanwhile). */
export class SchemaMismatchError extends Error {
  constructor() {
    super('The server has a newer spec form than this page. Reload the page to get it.');
    this.name = 'SchemaMismatchError';
  }
}

/** Rewrites ajv's messages in place in the server's words ("must be >= 10 V, got 4 V"). */
export function localizeSpecErrors(errors?: ErrorObject[] | null): void {
  for (const error of errors ?? []) {
    const [issue] = issuesFromAjvErrors([error]);
    if (issue) error.message = issue.message;
  }
}

/** The validator for `schema`; throws SchemaMismatchError when it is not the compiled one. */
export function specValidator(schema: RJSFSchema): ValidatorType {
  if (hashForSchema(schema) !== SPEC_SCHEMA_HASH) throw new SchemaMismatchError();
  return createPrecompiledValidator(SPEC_VALIDATORS, schema, localizeSpecErrors);
}
