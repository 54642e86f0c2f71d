/**
 * Seeded pseudo-random numbers for the Monte Carlo: the same seed gives the same samples on
 * every machine, so a proposal's yield can be reproduced. mulberry32 (a public-domain 32-bit
 * generator, common practice for reproducible simulation) and the Box–Muller transform
 * (G. E. P. Box, M. E. Muller, Ann. Math. Statist. 29, 1958).
 */

export interface GaussianSource {
  /** A standard normal sample (mean 0, σ 1). */
  next(): number;
}

/** A standard-normal generator seeded with a 32-bit integer. */
export function gaussianSource(seed: number): GaussianSource {
  let state = seed >>> 0;
  const uniform = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
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
