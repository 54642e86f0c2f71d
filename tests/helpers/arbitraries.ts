/**
 * Arbitraries that sample what they say, for property tests. fast-check's `fc.double` draws
 * uniformly over the doubles' bit patterns, so a range that spans zero gives mostly values of
 * tiny magnitude (of [−9, 15], about nine in ten within 0.001 of 0), and its integers lean
 * towards small values and the bounds on early runs. These draw plain integers without that
 * lean (`fc.noBias`) and scale them: a uniform fraction, a uniform value in a range, and a
 * log-uniform value drawn as a decade and a mantissa. tests/unit/helpers/arbitraries.test.ts
 * checks their spread.
 */
import fc from 'fast-check';

/** Steps of the uniform fraction: 2^30 (finer than any tolerance the properties use). */
const FRACTION_STEPS = 2 ** 30;

/** A uniform fraction in [0, 1), in steps of 2^−30. */
export function uniformFraction(): fc.Arbitrary<number> {
  return fc.noBias(fc.integer({ min: 0, max: FRACTION_STEPS - 1 })).map((k) => k / FRACTION_STEPS);
}

/** A uniform value in [min, max): every stretch of the range equally likely, however it sits around 0. */
export function uniformBetween(min: number, max: number): fc.Arbitrary<number> {
  if (!(Number.isFinite(min) && Number.isFinite(max) && min < max)) throw new RangeError(`uniformBetween needs finite min < max, got ${min}, ${max}`);
  return uniformFraction().map((u) => min + (max - min) * u);
}

/** A log-uniform value's parts: value = mantissa · 10^decade, mantissa in [1, 10). */
export interface LogUniformDraw {
  value: number;
  mantissa: number;
  decade: number;
}

/**
 * Log-uniform draws over whole decades [10^minDecade, 10^maxDecade): each decade equally likely
 * (an integer exponent), and within it log10(mantissa) uniform in [0, 1), so each equal ratio
 * of values is equally likely, as values spread over decades (resistances, currents) are.
 */
export function logUniformDraw(minDecade: number, maxDecade: number): fc.Arbitrary<LogUniformDraw> {
  if (!(Number.isInteger(minDecade) && Number.isInteger(maxDecade) && minDecade < maxDecade)) {
    throw new RangeError(`logUniform needs integer decades, min < max, got ${minDecade}, ${maxDecade}`);
  }
  return fc.tuple(fc.noBias(fc.integer({ min: minDecade, max: maxDecade - 1 })), uniformFraction()).map(([decade, u]) => {
    const mantissa = 10 ** u;
    // Decimal text keeps 4.7e3 exactly 4700 where 4.7 * 10 ** 3 could round
    return { value: Number(`${mantissa}e${decade}`), mantissa, decade };
  });
}

/** The values of `logUniformDraw`: log-uniform over [10^minDecade, 10^maxDecade). */
export function logUniform(minDecade: number, maxDecade: number): fc.Arbitrary<number> {
  return logUniformDraw(minDecade, maxDecade).map((draw) => draw.value);
}
