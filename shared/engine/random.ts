/**
 * Seeded pseudo-random numbers for the Monte Carlo: the same seed gives the same samples on
 * every machine, so a proposal's yield can be reproduced. mulberry32 (Tommy Ettinger's
 * public-domain 32-bit generator, common practice for reproducible simulation) and the
 * Box–Muller transform (G. E. P. Box, M. E. Muller, Ann. Math. Statist. 29, 1958).
 */

export interface GaussianSource {
  /** A standard normal sample (mean 0, σ 1). */
  next(): number;
}

/** Largest seed: the generator's state is 32 bits, and the spec schema allows 0 ... 2^32 − 1. */
export const MAX_SEED = 0xffffffff;

/**
 * mulberry32's stream of unsigned 32-bit integers from `seed`, every one of its 32 bits used.
 * Throws RangeError unless the seed is an integer in [0, MAX_SEED]: a larger or fractional seed
 * is refused, never folded silently onto another seed's samples.
 */
export function mulberry32(seed: number): () => number {
  if (!Number.isInteger(seed) || seed < 0 || seed > MAX_SEED) {
    throw new RangeError(`The seed must be an integer from 0 to ${MAX_SEED}, got ${seed}`);
  }
  let state = seed;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return (t ^ (t >>> 14)) >>> 0;
  };
}

/** A standard-normal generator seeded with a 32-bit integer (see `mulberry32` for the seeds allowed). */
export function gaussianSource(seed: number): GaussianSource {
  const next32 = mulberry32(seed);
  const uniform = (): number => next32() / 4294967296; // [0, 1)
  let spare: number | null = null;
  return {
    next() {
      if (spare !== null) {
        const s = spare;
        spare = null;
        return s;
      }
      const u1 = 1 - uniform(); // (0, 1]: keeps log finite
      const u2 = uniform();
      const radius = Math.sqrt(-2 * Math.log(u1));
      spare = radius * Math.sin(2 * Math.PI * u2);
      return radius * Math.cos(2 * Math.PI * u2);
    },
  };
}
