/**
 * Validation of the two public inputs, the requirement spec and the `analyze` design: one ajv
 * instance, each schema (shared/schema, the single source of truth) compiled once at load;
 * on a copy, older spec documents upgraded (spec-upgrade.ts), defaults applied, then the
 * cross-field rules. Errors are "/json/path: message".
 */
import AjvImport, { type SchemaObject, type ValidateFunction } from 'ajv';
import { hasModelCard, resolvedParameters } from './engine/bjt-parameters';
import type { Design, Spec } from './engine/types';
import designSchemaJson from './schema/design.schema.json';
import mosDesignSchemaJson from './schema/mos-design.schema.json';
import type { MosDesign } from './engine/mos-stage';
import specSchemaJson from './schema/spec.schema.json';
import { issuesFromAjvErrors } from './validation/ajv-issues';
import { designCrossFieldIssues, mosDesignCrossFieldIssues, mosFamilyRefusal, specCrossFieldIssues } from './validation/cross-field-rules';
import { upgradeSpecDocument } from './validation/spec-upgrade';
import type { ValidationIssue, ValidationResult } from './validation/validation-issue';

export { formatIssue, type ValidationIssue, type ValidationResult } from './validation/validation-issue';

/** The requirement-spec JSON Schema (draft-07), for the web form and the server. Do not mutate. */
export const SPEC_SCHEMA: SchemaObject = specSchemaJson;
/** The `analyze` design JSON Schema (draft-07), for the web form and the server. Do not mutate. */
export const DESIGN_SCHEMA: SchemaObject = designSchemaJson;
/** The `analyze` design JSON Schema of the MOS families ("nmos", "pmos"). Do not mutate. */
export const MOS_DESIGN_SCHEMA: SchemaObject = mosDesignSchemaJson;

// ajv is CommonJS: under Node's ESM loader the default import is module.exports, elsewhere .default
const Ajv = (AjvImport as unknown as { default?: typeof AjvImport }).default ?? AjvImport;

const ajv = new Ajv({
  allErrors: true, // report every problem, not just the first
  useDefaults: true,
  discriminator: true, // the tail's oneOf picks its branch by `topology`
  verbose: true, // errors carry the data and schema, for messages with units and values
});
ajv.addKeyword('x-unit');
ajv.addKeyword('x-typical'); // the range a field's values usually fall in (shared/units/plausibility.ts); never refuses

const validateSpecSchema: ValidateFunction = ajv.compile(SPEC_SCHEMA);
const validateDesignSchema: ValidateFunction = ajv.compile(DESIGN_SCHEMA);
const validateMosDesignSchema: ValidateFunction = ajv.compile(MOS_DESIGN_SCHEMA);

/**
 * Validates a requirement spec; on success `value` is a copy with every default filled in. With a
 * model card (`device.model`), the device fields the spec leaves out are the card's: `beta` its
 * BF, `earlyVoltageV` its VAF (0 when infinite), `saturationCurrentA` its IS, not the schema's
 * defaults; fields it gives must equal them (a cross-field rule).
 */
export function validateSpec(input: unknown): ValidationResult<Spec> {
  const refusal = mosFamilyRefusal(input, 'to recommend');
  if (refusal.length > 0) return { ok: false, errors: refusal };
  return validateWith<Spec>(input, validateSpecSchema, specCrossFieldIssues, upgradeSpecDocument, withCardValues);
}

/** The device fields a card stands for, with its parameter. */
const CARD_FIELDS = [
  ['beta', 'BF'],
  ['earlyVoltageV', 'VAF'],
  ['saturationCurrentA', 'IS'],
] as const;

/**
 * Before the schema's defaults: which card fields the document left out. After: those take the
 * card's values (the schema has checked the card by then).
 */
function withCardValues(copy: unknown): ((value: Spec) => void) | undefined {
  const device = (copy as { device?: unknown } | null)?.device;
  if (device === null || typeof device !== 'object' || !('model' in device)) return undefined;
  const missing = CARD_FIELDS.filter(([field]) => !(field in device));
  return (value) => {
    const { model } = value.device;
    if (!model || !hasModelCard(value.device)) return;
    const card = resolvedParameters(model);
    for (const [field, parameter] of missing) value.device[field] = Number.isFinite(card[parameter]) ? card[parameter] : 0;
  };
}

/** Validates an `analyze` input; on success `value` is a copy with the documented defaults filled in. */
export function validateDesign(input: unknown): ValidationResult<Design> {
  const refusal = mosFamilyRefusal(input, 'here');
  if (refusal.length > 0) return { ok: false, errors: refusal };
  return validateWith<Design>(input, validateDesignSchema, designCrossFieldIssues);
}

/** Validates an `analyze` input of a MOS family ("nmos", "pmos"); on success `value` is a copy with the defaults filled in. */
export function validateMosDesign(input: unknown): ValidationResult<MosDesign> {
  return validateWith<MosDesign>(input, validateMosDesignSchema, mosDesignCrossFieldIssues);
}

/** Whether an `analyze` input names a MOS family (`device.family` "nmos" or "pmos"): validateMosDesign takes it. */
export function isMosDesignInput(input: unknown): boolean {
  return mosFamilyRefusal(input, '').length > 0;
}

/** Nesting kept when copying input; anything deeper is cut (no schema here nests past a few levels). */
const MAX_COPY_DEPTH = 64;
const NOT_JSON = Symbol('not JSON');

/**
 * A copy of JSON data, subtrees deeper than MAX_COPY_DEPTH replaced by null: a hostile body of
 * thousands of nested arrays cannot exhaust the stack, and the schema still reports it at the
 * field where it starts. NOT_JSON for values no JSON document holds (functions, symbols, class instances).
 */
function jsonCopy(value: unknown, depth: number): unknown {
  // Numbers pass as they are (the schema names NaN and Infinity at their field), so does undefined.
  if (value === null || value === undefined || typeof value === 'string' || typeof value === 'boolean' || typeof value === 'number') return value;
  if (typeof value !== 'object') return NOT_JSON;
  if (depth >= MAX_COPY_DEPTH) return null;
  if (Array.isArray(value)) {
    const items = value.map((item) => jsonCopy(item, depth + 1));
    return items.includes(NOT_JSON) ? NOT_JSON : items;
  }
  if (Object.getPrototypeOf(value) !== Object.prototype && Object.getPrototypeOf(value) !== null) return NOT_JSON;
  const entries = Object.entries(value).map(([key, item]) => [key, jsonCopy(item, depth + 1)] as const);
  return entries.some(([, item]) => item === NOT_JSON) ? NOT_JSON : Object.fromEntries(entries);
}

function validateWith<T>(
  input: unknown,
  schemaCheck: ValidateFunction,
  crossFieldIssues: (value: T) => ValidationIssue[],
  upgrade: (copy: unknown) => ValidationIssue[] = () => [],
  afterDefaults: (copy: unknown) => ((value: T) => void) | undefined = () => undefined,
): ValidationResult<T> {
  const copy = jsonCopy(input, 0); // defaults are written into the copy, never the caller's object
  if (copy === NOT_JSON) return { ok: false, errors: [{ path: '', message: 'must be plain JSON data' }] };
  const upgradeIssues = upgrade(copy); // older documents read as today's (renamed fields)
  if (upgradeIssues.length > 0) return { ok: false, errors: upgradeIssues };
  const finish = afterDefaults(copy); // sees the document as written, acts once the schema has passed
  if (!schemaCheck(copy)) return { ok: false, errors: issuesFromAjvErrors(schemaCheck.errors ?? []) };
  finish?.(copy as T);
  const issues = crossFieldIssues(copy as T);
  return issues.length > 0 ? { ok: false, errors: issues } : { ok: true, value: copy as T };
}

/**
 * Compiles another JSON Schema (a route body, say) with the same ajv instance and error
 * messages. The returned check works on a copy with defaults applied, like validateSpec.
 */
export function compileValidator<T>(schema: object): (input: unknown) => ValidationResult<T> {
  const check = ajv.compile(schema);
  return (input) => validateWith<T>(input, check, () => []);
}
