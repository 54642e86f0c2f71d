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

/**
 * The validator for `schema`; throws SchemaMismatchError when it is not the compiled one.
 *
 * That check, once, is the check that the served schema is the compiled one. rjsf's validator
 * repeats it on every call by comparing the schema it is handed with the root schema resolved
 * against the raw form data; with a conditional in the schema (the device's `if`/`then`: BF and
 * VAF defaults only without a card model) the form hands it the root resolved against the data
 * with its defaults, which differs, and every validation would throw. The per-call comparison is
 * therefore replaced by the hash check above (validation itself always runs the root's compiled
 * function, whatever schema is handed in).
 */
export function specValidator(schema: RJSFSchema): ValidatorType {
  if (hashForSchema(schema) !== SPEC_SCHEMA_HASH) throw new SchemaMismatchError();
  const validator = createPrecompiledValidator(SPEC_VALIDATORS, schema, localizeSpecErrors);
  (validator as unknown as { ensureSameRootSchema: () => boolean }).ensureSameRootSchema = () => true;
  return validator;
}

type Node = Record<string, unknown>;

/**
 * The schema the form lays out: the served one with the device's conditional (`if`/`then`: the
 * BF and VAF defaults apply only without a card model) folded into plain defaults. rjsf re-sanitizes
 * the data of a schema with a nested conditional on every change and then writes `{}` for each
 * absent object field (`deviceModel`, `device.model`), which no spec means; without the
 * conditional it leaves absent fields absent. Validation still runs the compiled served schema
 * (`specValidator`), conditional included; the defaults matter only while no card is chosen,
 * since choosing one sets BF and VAF to the card's.
 */
export function specFormSchema(schema: RJSFSchema): RJSFSchema {
  const device = (schema.properties as Node | undefined)?.device as Node | undefined;
  if (!device || !('if' in device)) return schema;
  const { if: _if, then, else: _else, ...plain } = device;
  const properties = { ...(plain.properties as Node) };
  for (const [name, extra] of Object.entries(((then as Node | undefined)?.properties as Node | undefined) ?? {})) {
    properties[name] = { ...(properties[name] as Node), ...(extra as Node) };
  }
  return { ...schema, properties: { ...(schema.properties as Node), device: { ...plain, properties } } } as RJSFSchema;
}
