/**
 * The engine's error for bad input (shared/engine/errors.ts): the contract asks that bad input
 * names the offending field by its JSON path, e.g. "/supply/negativeV: must be < supply.positiveV"
 * (ENGINE-CONTRACT.md), and that a caller can tell it from any other error.
 */
import { expect, test } from 'vitest';
import { InputError } from '#shared/engine/index';
import { severityOfKind } from '#shared/engine/types';

test('the message starts with the JSON path of the offending field, then says what is wrong', () => {
  const error = new InputError('/supply/negativeV', 'must be < supply.positiveV');
  expect(error.message).toBe('/supply/negativeV: must be < supply.positiveV');
  expect(error.path).toBe('/supply/negativeV');
});

test('it is an Error a caller can tell apart by type and by name', () => {
  const error = new InputError('/tail/topology', 'unknown');
  expect(error).toBeInstanceOf(Error);
  expect(error).toBeInstanceOf(InputError);
  expect(error.name).toBe('InputError');
});

test('a rule\'s kind gives its checks\' severity: blocking blocks; advisory and caution (a repeated hazard) advise', () => {
  expect(severityOfKind('blocking')).toBe('blocking');
  expect(severityOfKind('advisory')).toBe('advisory');
  expect(severityOfKind('caution')).toBe('advisory');
});
