/**
 * Turns ajv's errors into one plain issue per problem, located at the offending field: a missing
 * or unknown property gets its own path, ranges name their unit and the value received, and
 * the tail's `oneOf` collapses into "must be one of resistor, simple-mirror, ...".
 */
import type { ErrorObject } from 'ajv';
import { PLAIN_LINES_PATTERN, PLAIN_LINE_PATTERN, PLAIN_NAME_PATTERN, unsafeTextMessage } from '../text/plain-text';
import { unitSymbolFor } from '../units/unit-symbols';
import { pointerSegment, type ValidationIssue } from './validation-issue';

type SchemaNode = Record<string, unknown>;
type IssueBuilder = (error: ErrorObject) => ValidationIssue | undefined;

/** Messages per ajv keyword; keywords not listed keep ajv's own message. */
const BUILDERS: Record<string, IssueBuilder> = {
  required: (e) => ({ path: childPath(e, e.params.missingProperty), message: 'is required' }),
  additionalProperties: (e) => ({
    path: childPath(e, e.params.additionalProperty),
    message: 'is not a known field here (remove it or check its spelling)',
  }),
  type: (e) => at(e, `must be ${withArticle(e.params.type)}, got ${describeData(e.data)}`),
  minimum: (e) => at(e, `must be >= ${withUnit(e.params.limit, e)}, got ${withUnit(e.data, e)}`),
  exclusiveMinimum: (e) => at(e, `must be > ${withUnit(e.params.limit, e)}, got ${withUnit(e.data, e)}`),
  maximum: (e) => at(e, `must be <= ${withUnit(e.params.limit, e)}, got ${withUnit(e.data, e)}`),
  exclusiveMaximum: (e) => at(e, `must be < ${withUnit(e.params.limit, e)}, got ${withUnit(e.data, e)}`),
  enum: (e) => at(e, `must be one of ${(e.params.allowedValues as unknown[]).join(', ')}, got ${describeData(e.data)}`),
  const: (e) => at(e, `must be ${JSON.stringify(e.params.allowedValue)}, got ${describeData(e.data)}`),
  not: (e) => at(e, notMessage(e)),
  minItems: (e) => at(e, `must list at least ${e.params.limit} item(s)`),
  uniqueItems: (e) => at(e, `must not repeat an item (items ${e.params.j} and ${e.params.i} are the same)`),
  minLength: (e) => at(e, e.params.limit === 1 ? 'must not be empty' : `must be at least ${e.params.limit} characters`),
  maxLength: (e) => at(e, `must be at most ${e.params.limit} characters`),
  pattern: (e) => at(e, patternMessage(e)),
  discriminator: discriminatorIssue,
  // Summaries of branch errors already reported one by one
  oneOf: () => undefined,
  anyOf: () => undefined,
  if: () => undefined,
};

/** One issue per problem, in ajv's order, duplicates dropped. */
export function issuesFromAjvErrors(errors: readonly ErrorObject[]): ValidationIssue[] {
  const seen = new Set<string>();
  const issues: ValidationIssue[] = [];
  // A value of the wrong type fails its enum and ranges too; the type is the one thing to say
  const wrongType = new Set(errors.filter((e) => e.keyword === 'type').map((e) => e.instancePath));
  for (const error of errors) {
    if (error.keyword !== 'type' && wrongType.has(error.instancePath)) continue;
    const builder = BUILDERS[error.keyword] ?? ((e: ErrorObject) => at(e, e.message ?? 'is not valid'));
    const issue = builder(error);
    const key = issue && `${issue.path}\u0000${issue.message}`;
    // Stryker disable next-line LogicalOperator: equivalent, key is undefined exactly when issue is
    if (!issue || !key || seen.has(key)) continue;
    seen.add(key);
    issues.push(issue);
  }
  return issues;
}

/** The tag of a discriminated `oneOf` is missing, not a string, or names no branch. */
function discriminatorIssue(e: ErrorObject): ValidationIssue | undefined {
  const tag = e.params.tag as string;
  const path = childPath(e, tag);
  // A missing tag is already reported by `required`
  // Stryker disable next-line ConditionalExpression: equivalent, ajv gives an undefined tagValue only with error "tag"
  if (e.params.error === 'tag' && e.params.tagValue === undefined) return undefined;
  const branches = ((e.parentSchema as SchemaNode | undefined)?.oneOf ?? []) as SchemaNode[];
  const values = branches.map((b) => ((b.properties as SchemaNode)[tag] as SchemaNode).const);
  return { path, message: `must be one of ${values.join(', ')}, got ${describeData(e.params.tagValue)}` };
}

/**
 * A failed pattern: a refused character in text is named with its position (shared/text/plain-text.ts),
 * a name of blanks is blank; anything else is not in the expected format.
 */
function patternMessage(e: ErrorObject): string {
  const pattern = e.params.pattern as string;
  const plain = pattern === PLAIN_LINE_PATTERN || pattern === PLAIN_LINES_PATTERN || pattern === PLAIN_NAME_PATTERN;
  // Stryker disable next-line ConditionalExpression,EqualityOperator,StringLiteral: equivalent, ajv reports a pattern only for a string
  const unsafe = plain && typeof e.data === 'string' ? unsafeTextMessage(e.data, pattern === PLAIN_LINES_PATTERN) : null;
  if (unsafe) return unsafe;
  return pattern === '\\S' || pattern === PLAIN_NAME_PATTERN ? 'must not be blank' : 'is not in the expected format';
}

/** "must not be strictly between 0 and 1 V" for a `not` holding an open interval. */
function notMessage(e: ErrorObject): string {
  const excluded = e.schema as SchemaNode;
  if (typeof excluded.exclusiveMinimum === 'number' && typeof excluded.exclusiveMaximum === 'number') {
    const range = `${excluded.exclusiveMinimum} and ${withUnit(excluded.exclusiveMaximum, e)}`;
    return `must not be strictly between ${range}, got ${withUnit(e.data, e)}`;
  }
  return 'is not an allowed value';
}

function at(e: ErrorObject, message: string): ValidationIssue {
  return { path: e.instancePath, message };
}

function childPath(e: ErrorObject, name: string): string {
  return `${e.instancePath}/${pointerSegment(name)}`;
}

/** A number with the field's `x-unit` ("12 V"); dimensionless units print nothing. */
function withUnit(value: unknown, e: ErrorObject): string {
  const unit = (e.parentSchema as SchemaNode | undefined)?.['x-unit'];
  const printed = typeof unit === 'string' ? unitSymbolFor(unit).printed : '';
  return printed === '' ? String(value) : `${String(value)} ${printed}`;
}

function withArticle(type: string): string {
  return /^[aeiou]/.test(type) ? `an ${type}` : `a ${type}`;
}

/** What was received, briefly: numbers and booleans as written, strings quoted, else the kind. */
function describeData(data: unknown): string {
  // Stryker disable next-line ConditionalExpression: equivalent, undefined falls through to the same String(data)
  if (data === null || data === undefined) return String(data);
  if (Array.isArray(data)) return 'an array';
  if (typeof data === 'string') return JSON.stringify(data.length > 40 ? `${data.slice(0, 40)}…` : data);
  if (typeof data === 'object') return 'an object';
  return String(data);
}
