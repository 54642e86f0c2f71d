/**
 * Every MOS design the validation accepts either solves to finite figures or is refused with a
 * ConvergenceError (the command line's exit 2, "this design cannot be solved") or, when its pair
 * is cut off, an InputError at /inputCommonModeV (exit 2): never another error, never a NaN. Designs drawn at random over wide ranges (rails 1–50 V, resistors
 * 100 Ω–10 MΩ, sizes 1 µm–1 mm by 0.2–20 µm, −55 to 150 °C, every tail, both families);
 * common practice for a solver's robustness.
 */
import { describe, expect, test } from 'vitest';
import { mulberry32 } from '#shared/engine/random';
import { analyzeMos, MOS_TAIL_TOPOLOGIES, type MosDesign } from '#shared/engine/mos-stage';
import { ConvergenceError } from '#shared/engine/operating-point';
import { InputError } from '#shared/engine/errors';
import { validateMosDesign } from '#shared/validate';

const DESIGNS = 150;

function randomDesign(random: () => number, index: number): unknown {
  const logUniform = (low: number, high: number) => low * (high / low) ** random();
  const size = () => ({ widthM: logUniform(1e-6, 1e-3), lengthM: logUniform(2e-7, 2e-5) });
  const [output, reference, cascode, extra] = [size(), size(), size(), size()];
  const common = { referenceResistanceOhm: logUniform(100, 1e7), ...output, referenceWidthM: reference.widthM, referenceLengthM: reference.lengthM };
  const cascodeSize = { cascodeWidthM: cascode.widthM, cascodeLengthM: cascode.lengthM };
  const tails = {
    resistor: { resistanceOhm: logUniform(100, 1e7) },
    'simple-mirror': common,
    cascode: { ...common, ...cascodeSize },
    'wide-swing-cascode': { ...common, ...cascodeSize, biasResistanceOhm: logUniform(100, 1e7), biasWidthM: extra.widthM, biasLengthM: extra.lengthM },
    'regulated-cascode': { ...common, ...cascodeSize, boosterResistanceOhm: logUniform(100, 1e7), boosterWidthM: extra.widthM, boosterLengthM: extra.lengthM },
  };
  const topology = MOS_TAIL_TOPOLOGIES[index % MOS_TAIL_TOPOLOGIES.length];
  const family = random() < 0.5 ? 'nmos' : 'pmos';
  const positiveV = logUniform(1, 50);
  const negativeV = random() < 0.2 ? 0 : -logUniform(0.5, 50);
  const vto = logUniform(0.2, 2);
  return {
    device: { family, model: { VTO: family === 'nmos' ? vto : -vto, KP: logUniform(1e-6, 1e-3), LAMBDA: random() * 0.2, GAMMA: random(), PHI: 0.3 + random() } },
    supply: { positiveV, negativeV },
    drainResistanceOhm: logUniform(100, 1e7),
    pair: size(),
    tail: { topology, ...tails[topology] },
    inputCommonModeV: negativeV + (positiveV - negativeV) * (0.02 + 0.96 * random()),
    temperatureC: -55 + 205 * random(),
    pairSourceResistanceOhm: random() < 0.3 ? logUniform(10, 1e5) : 0,
    pairThresholdMismatchV: (random() - 0.5) * 0.01,
    drainMismatch: (random() - 0.5) * 0.02,
    pairBodyTiedToSource: random() < 0.2,
  };
}

describe('MOS stage robustness', () => {
  test(`${DESIGNS} random accepted designs: finite figures or a ConvergenceError, and all but a few solve`, () => {
    const stream = mulberry32(20261205);
    const random = () => stream() / 2 ** 32;
    let accepted = 0;
    let solved = 0;
    let unsolved = 0;
    for (let i = 0; i < DESIGNS; i += 1) {
      const checked = validateMosDesign(randomDesign(random, i));
      if (!checked.ok) continue;
      accepted += 1;
      let result: ReturnType<typeof analyzeMos>;
      try {
        result = analyzeMos(checked.value as MosDesign);
      } catch (error) {
        // an operating point that cannot be solved, or a pair cut off at its common mode (no gain to report)
        expect(error instanceof ConvergenceError || (error instanceof InputError && error.path === '/inputCommonModeV'), `${String(error)} ${JSON.stringify(checked.value)}`).toBe(true);
        if (error instanceof ConvergenceError) unsolved += 1;
        continue;
      }
      solved += 1;
      const numbers = [result.tailCurrentA, result.drainCurrentA, result.drainVoltageV, result.tailNodeVoltageV, result.transconductanceS, result.tailOutputResistanceOhm, result.differentialGain, result.commonModeGain, result.powerW, result.cmrrDb.singleEnded];
      expect(numbers.every(Number.isFinite), JSON.stringify(checked.value)).toBe(true);
    }
    expect(accepted).toBeGreaterThan(DESIGNS * 0.8);
    // measured: about 1 design in 200 of these wide ranges cannot be solved (ngspice solves them, ours stalls)
    expect(unsolved).toBeLessThanOrEqual(accepted * 0.03);
    expect(solved).toBeGreaterThan(accepted * 0.8);
  });
});
