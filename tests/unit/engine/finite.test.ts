/**
 * The guard that keeps NaN and Infinity out of the engine's output (shared/engine/finite.ts):
 * JSON has no such numbers (RFC 8259 §6: "Numeric values that cannot be represented ... such as
 * Infinity and NaN are not permitted"; JSON.stringify writes them as null), so the first one is
 * found and named by its JSON Pointer path (RFC 6901).
 */
import { expect, test } from 'vitest';
import { firstNonFinitePath } from '#shared/engine/finite';

test('every number finite, at any depth: null', () => {
  expect(firstNonFinitePath({ a: 1, b: [2, { c: -3.5e-12 }], d: 'text', e: null, f: true })).toBeNull();
  expect(firstNonFinitePath([])).toBeNull();
  expect(firstNonFinitePath(0)).toBeNull();
});

test('a non-finite number at the top is the root path "/"', () => {
  expect(firstNonFinitePath(Number.NaN)).toBe('/');
  expect(firstNonFinitePath(Number.POSITIVE_INFINITY)).toBe('/');
});

test('a non-finite number inside objects and arrays is named by its JSON Pointer path', () => {
  expect(firstNonFinitePath({ predicted: { cmrrDb: { singleEnded: 60, differential: Number.NEGATIVE_INFINITY } } })).toBe('/predicted/cmrrDb/differential');
  expect(firstNonFinitePath({ curve: [{ db: 1 }, { db: 2 }, { db: Number.NaN }] })).toBe('/curve/2/db');
});

test('the first one in document order, when there are several', () => {
  expect(firstNonFinitePath({ a: [1, Number.NaN], b: Number.NaN })).toBe('/a/1');
  expect(firstNonFinitePath([Number.POSITIVE_INFINITY, Number.NaN])).toBe('/0');
});

test('strings that read as numbers are not numbers', () => {
  expect(firstNonFinitePath({ a: 'NaN', b: 'Infinity' })).toBeNull();
});
