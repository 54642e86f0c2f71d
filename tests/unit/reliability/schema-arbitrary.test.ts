/**
 * The reliability run's fast-check arbitraries (tests/reliability/schema-arbitrary.ts): values
 * generated from a route's body schema pass that schema (ajv, the validator the server uses),
 * so the fuzz reaches the services behind validation; hostile() mixes in values the schema
 * refuses, so validation is exercised too.
 */
import AjvImport from 'ajv';
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { DIFF_QUERY, LOGIN_BODY, MEMBERSHIP_BODY, MONTE_CARLO_BODY, NETLIST_QUERY, NEW_PROJECT_BODY, NEW_USER_BODY, PREFERENCES_BODY, PROPOSAL_LIST_QUERY, REVIEW_BODY, USER_CHANGES_BODY } from '../../../api/validation/bodies';
import { DESIGN_SCHEMA } from '#shared/validate';
import { arbitraryFromSchema, hostile } from '../../reliability/schema-arbitrary';

const Ajv = (AjvImport as unknown as { default?: typeof AjvImport }).default ?? AjvImport;
const ajv = new Ajv({ allErrors: true, discriminator: true });
ajv.addKeyword('x-unit');
ajv.addKeyword('x-typical');

const SCHEMAS: [string, object][] = [
  ['LOGIN_BODY', LOGIN_BODY],
  ['NEW_USER_BODY', NEW_USER_BODY],
  ['USER_CHANGES_BODY', USER_CHANGES_BODY],
  ['PREFERENCES_BODY', PREFERENCES_BODY],
  ['NEW_PROJECT_BODY', NEW_PROJECT_BODY],
  ['MEMBERSHIP_BODY', MEMBERSHIP_BODY],
  ['REVIEW_BODY', REVIEW_BODY],
  ['MONTE_CARLO_BODY', MONTE_CARLO_BODY],
  ['PROPOSAL_LIST_QUERY', PROPOSAL_LIST_QUERY],
  ['DIFF_QUERY', DIFF_QUERY],
  ['NETLIST_QUERY', NETLIST_QUERY],
];

describe('when values are generated from a route body schema', () => {
  test.each(SCHEMAS)('when %s is generated from, then every value passes the schema', (_name, schema) => {
    const validate = ajv.compile(schema);

    fc.assert(
      fc.property(arbitraryFromSchema(schema as Record<string, unknown>), (value) => validate(value) === true),
      { numRuns: 150, seed: 7 },
    );
  });

  test('when the design schema (refs, oneOf by topology, ranges, a numeric `not`) is generated from, then every value passes it', () => {
    const validate = ajv.compile(DESIGN_SCHEMA);

    fc.assert(
      fc.property(arbitraryFromSchema(DESIGN_SCHEMA as Record<string, unknown>), (value) => validate(value) === true),
      { numRuns: 200, seed: 11 },
    );
  });
});

describe('when hostile() mixes values', () => {
  test('when 300 hostile project bodies are drawn, then some pass the schema and some are refused', () => {
    const validate = ajv.compile(NEW_PROJECT_BODY);

    const values = fc.sample(hostile(arbitraryFromSchema(NEW_PROJECT_BODY)), { numRuns: 300, seed: 3 });
    const passing = values.filter((value) => validate(value)).length;

    expect(passing).toBeGreaterThan(50);
    expect(values.length - passing).toBeGreaterThan(50);
  });
});
