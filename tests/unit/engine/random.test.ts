/**
 * The Monte Carlo's generator pinned to the published algorithm. Expected values come from an
 * independent reimplementation of mulberry32 as Tommy Ettinger published it in C (public domain,
 * 2017; quoted from memory: z = (state += 0x6D2B79F5); z = (z ^ z >> 15) * (z | 1);
 * z ^= z + (z ^ z >> 7) * (z | 61); return z ^ z >> 14), run by hand in Python 3 with
 * arbitrary-precision integers masked to 32 bits, and Box–Muller on u1 = 1 − x/2^32,
 * u2 = y/2^32 [Box & Muller 1958]. The numbers are pasted here as literals. Cross-check: the
 * well-known first value of the JavaScript form seeded with 0 is 0.26642920868471265
 * (1144304738 / 2^32).
 */
import { describe, expect, test } from 'vitest';
import { monteCarloDraws } from '#shared/engine/mismatch';
import { gaussianSource, MAX_SEED, mulberry32 } from '#shared/engine/random';

/** seed → first four 32-bit outputs and the first four standard-normal draws made from them. */
const REFERENCE: [seed: number, raw: number[], normals: number[]][] = [
  [0, [1144304738, 1416247, 958946056, 627933444], [0.7871846599200555, 0.0016309335012816644, 0.43143961704601397, 0.5649690575787788]],
  [1, [2693262067, 11749833, 2265367787, 4213581821], [1.4043387784152637, 0.024141617523036025, 1.2157546192705377, -0.14543594087912323]],
  [42, [2581720956, 1925393290, 3661312704, 2876485805], [-1.2848381576290195, 0.43278026787558976, -0.9453528099747296, -1.7128042818055647]],
  [255, [1470338743, 4062225934, 1416639116, 638755950], [0.8629416318584332, -0.30572190201194666, 0.5316804369470953, 0.7195724632234591]],
  // 256 = 0x100: a seed cut to its low 8 bits would give seed 0's stream
  [256, [3843528572, 1599976150, 4183432741, 1963147087], [-1.477383824785705, 1.5240919197598206, -2.604512239843221, 0.719892718404079]],
  // 2^31 + 7: the sign bit of a 32-bit signed integer set
  [2147483655, [2587615286, 3152316922, 2347100052, 2627152902], [-0.1366959236072252, -1.3514121614598085, -0.9604306951327848, -0.8117823943576427]],
  [0xdeadbeef, [4043151706, 1147597007, 3315858022, 1538288752], [-0.2568397615054203, 2.3679184337715777, -1.0807456991353368, 1.337572676586208]],
  // 2^32 − 1, the largest seed the spec schema allows
  [4294967295, [3850105811, 813802916, 3073704848, 4054706436], [0.7904166437532407, 1.9774008296468601, 1.4889551557314555, -0.5460129960432787]],
];

/** Box–Muller uses log, sqrt, cos and sin; two libraries' results may differ in the last bits. */
const NORMAL_RELATIVE_TOLERANCE = 1e-12;

describe('mulberry32 against the published algorithm', () => {
  test.each(REFERENCE)('seed %d: first four 32-bit outputs', (seed, raw) => {
    const next = mulberry32(seed);
    expect([next(), next(), next(), next()]).toEqual(raw);
  });

  test.each(REFERENCE)('seed %d: first four normal draws (Box–Muller)', (seed, _raw, normals) => {
    const gauss = gaussianSource(seed);
    for (const expected of normals) {
      const x = gauss.next();
      expect(Math.abs(x - expected), `${x} vs ${expected}`).toBeLessThanOrEqual(NORMAL_RELATIVE_TOLERANCE * Math.abs(expected));
    }
  });

  test.each(REFERENCE)('seed %d: the Monte Carlo draws start with that stream (the seed reaches the samples whole)', (seed, _raw, normals) => {
    const draws = monteCarloDraws(100, seed);
    expect(draws.seed).toBe(seed);
    normals.forEach((expected, i) => expect(Math.abs(draws.normals[i] - expected), `draw ${i}`).toBeLessThanOrEqual(NORMAL_RELATIVE_TOLERANCE * Math.abs(expected)));
  });

  test('every bit of the seed matters: seeds one bit apart give different streams', () => {
    const first = (seed: number) => mulberry32(seed)();
    const base = 0x5a5a5a5a;
    for (let bit = 0; bit < 32; bit += 1) {
      const flipped = (base ^ (1 << bit)) >>> 0;
      expect(first(flipped), `bit ${bit}`).not.toBe(first(base));
    }
  });
});

describe('seeds outside the 32-bit range are refused, not folded', () => {
  test.each([-1, 1.5, MAX_SEED + 1, 2 ** 32 + 5, 2 ** 53, NaN, Infinity])('seed %d throws RangeError', (seed) => {
    expect(() => mulberry32(seed)).toThrow(RangeError);
    expect(() => gaussianSource(seed)).toThrow(RangeError);
  });

  test('the largest seed is the spec schema maximum, 2^32 − 1', () => {
    expect(MAX_SEED).toBe(2 ** 32 - 1);
    expect(() => gaussianSource(MAX_SEED)).not.toThrow();
  });
});
