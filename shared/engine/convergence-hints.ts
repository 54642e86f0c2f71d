/**
 * When the operating point cannot be found even with continuation, which of the design's fields
 * make it hard: resistances far outside the usual range of a discrete input stage (nanoamp
 * currents through gigaohms, or milliohm resistors beside kilohms, leave node equations whose
 * terms differ by many decades), named by their JSON paths so the user knows what to change.
 */
import { ConvergenceError } from './operating-point';
import type { Design } from './types';

/** Usual resistances of a discrete input stage, ohms (common practice); outside it the solve gets hard. */
export const USUAL_RESISTANCE_MIN_OHM = 10;
export const USUAL_RESISTANCE_MAX_OHM = 1e6;

/** Every resistance of a design with its JSON path (a pair emitter resistance of 0 is "none"). */
export function designResistances(design: Design): { path: string; valueOhm: number }[] {
  const values: { path: string; valueOhm: number }[] = [{ path: '/collectorResistanceOhm', valueOhm: design.collectorResistanceOhm }];
  if (design.pairEmitterResistanceOhm) values.push({ path: '/pairEmitterResistanceOhm', valueOhm: design.pairEmitterResistanceOhm });
  // A tail's fields are its topology (text) and its resistances (numbers, ohms)
  for (const [key, value] of Object.entries(design.tail)) {
    if (typeof value === 'number') values.push({ path: `/tail/${key}`, valueOhm: value });
  }
  return values;
}

/**
 * The fields that make a design hard to solve: its resistances outside the usual range, the
 * furthest out first; when none is, the largest resistance (it sets the smallest current).
 */
export function hardFields(design: Design): string[] {
  const resistances = designResistances(design);
  const decadesOut = (r: number) => Math.max(Math.log10(r / USUAL_RESISTANCE_MAX_OHM), Math.log10(USUAL_RESISTANCE_MIN_OHM / r), 0);
  const outside = resistances.filter((r) => decadesOut(r.valueOhm) > 0).sort((a, b) => decadesOut(b.valueOhm) - decadesOut(a.valueOhm));
  if (outside.length > 0) return outside.map((r) => r.path);
  return [resistances.reduce((a, b) => (b.valueOhm > a.valueOhm ? b : a)).path];
}

/** The convergence error of a design with the fields that make it hard, named in the message too (it crosses worker threads as text). */
export function withHardFields(error: ConvergenceError, design: Design): ConvergenceError {
  const fields = hardFields(design);
  const outside = designResistances(design).some((r) => r.valueOhm < USUAL_RESISTANCE_MIN_OHM || r.valueOhm > USUAL_RESISTANCE_MAX_OHM);
  const why = outside ? `outside the usual ${USUAL_RESISTANCE_MIN_OHM} Ω to 1 MΩ` : 'the largest resistance';
  return new ConvergenceError(`${error.message}; the fields that make it hard: ${fields.join(', ')} (${why})`, fields);
}
