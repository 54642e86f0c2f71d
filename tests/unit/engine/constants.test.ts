/**
 * Physical constants and the temperature laws of shared/engine/constants.ts (and the IS(T) law
 * in device.ts that uses them). Expected values are the SI Brochure's exact constants, the
 * ngspice manual's IS(T) law written out here in its own algebraic form, and the common-practice
 * −2 mV/K of a forward-biased base-emitter junction.
 */
import { describe, expect, test } from 'vitest';
import {
  BOLTZMANN_J_PER_K,
  ELEMENTARY_CHARGE_C,
  ENERGY_GAP_EV,
  IS_TEMPERATURE_EXPONENT,
  NOMINAL_TEMPERATURE_C,
  ZERO_CELSIUS_K,
  thermalVoltageV,
} from '#shared/engine/constants';
import { npnModel, saturationCurrentAtA } from '#shared/engine/device';

describe('SI constants', () => {
  test('k is exactly 1.380649e-23 J/K [SI]', () => {
    expect(BOLTZMANN_J_PER_K).toBe(1.380649e-23); // [SI] 9th ed., exact by definition since 2019
  });

  test('q is exactly 1.602176634e-19 C [SI]', () => {
    expect(ELEMENTARY_CHARGE_C).toBe(1.602176634e-19); // [SI] 9th ed., exact by definition since 2019
  });

  test('0 °C is 273.15 K [SI]', () => {
    expect(ZERO_CELSIUS_K).toBe(273.15); // [SI] definition of the Celsius scale
  });

  test('TNOM is 27 °C and the IS(T) law uses XTI = 3, EG = 1.11 eV [SPICE]', () => {
    expect(NOMINAL_TEMPERATURE_C).toBe(27); // [SPICE] ngspice default TNOM
    expect(IS_TEMPERATURE_EXPONENT).toBe(3); // [SPICE] BJT default XTI
    expect(ENERGY_GAP_EV).toBe(1.11); // [SPICE] BJT default EG
  });
});

describe('thermal voltage', () => {
  test('VT at 300.15 K is 25.865 mV to 4 significant digits [SI]', () => {
    const vtMilliV = thermalVoltageV(27) * 1e3;
    // [SI]/[DOMAIN]: kT/q at 300.15 K = 25.865 mV; 4 significant digits is a relative 5e-4
    expect(Math.abs(vtMilliV - 25.865) / 25.865).toBeLessThan(5e-4);
    expect(Number(vtMilliV.toPrecision(5))).toBe(25.865);
  });

  test.each([-55, 0, 27, 85, 150])('VT at %s °C equals k·T/q written out [SI]', (temperatureC) => {
    const expectedV = (1.380649e-23 * (temperatureC + 273.15)) / 1.602176634e-19; // [SI]
    expect(thermalVoltageV(temperatureC)).toBeCloseTo(expectedV, 15);
  });

  test('VT is proportional to absolute temperature (invariant)', () => {
    const ratio = thermalVoltageV(127) / thermalVoltageV(-73); // 400.15 K / 200.15 K
    expect(ratio).toBeCloseTo(400.15 / 200.15, 12);
  });
});

describe('IS(T), the saturation-current temperature law [SPICE]', () => {
  test.each([1e-16, 6e-15, 2.5e-13])('IS(TNOM) equals IS = %s A exactly', (isA) => {
    expect(saturationCurrentAtA(isA, 27)).toBe(isA);
  });

  // The law as the DOMAIN notes write it (ngspice manual, BJT temperature equations [SPICE]):
  //   IS(T) = IS·(T/Tnom)^XTI·exp((EG·q/k)·(1/Tnom − 1/T)), XTI = 3, EG = 1.11 eV, Tnom = 300.15 K.
  // The engine writes the exponent as (EG/VT(T))·(T/Tnom − 1); the two are algebraically equal.
  const independentIsA = (isA: number, temperatureC: number): number => {
    const k = 1.380649e-23; // [SI]
    const q = 1.602176634e-19; // [SI]
    const tNomK = 300.15;
    const tK = temperatureC + 273.15;
    return isA * (tK / tNomK) ** 3 * Math.exp(((1.11 * q) / k) * (1 / tNomK - 1 / tK));
  };

  test.each([
    [1e-15, -55],
    [1e-15, -10],
    [1e-15, 0],
    [4e-15, 50],
    [4e-15, 85],
    [3e-14, 125],
    [3e-14, 150],
  ])('IS = %s A at %s °C matches the law written out independently (relative 1e-12)', (isA, temperatureC) => {
    const expected = independentIsA(isA, temperatureC);
    expect(Math.abs(saturationCurrentAtA(isA, temperatureC) - expected) / expected).toBeLessThan(1e-12);
  });

  test('IS rises steeply with temperature: roughly doubles every 5 K near room temperature [SS]', () => {
    const ratio = saturationCurrentAtA(1e-15, 33) / saturationCurrentAtA(1e-15, 27);
    // [SS], from memory: "IS approximately doubles for every 5 °C rise"; over 6 K a loose 1.8 ... 2.6
    expect(ratio).toBeGreaterThan(1.8);
    expect(ratio).toBeLessThan(2.6);
  });
});

describe('VBE at constant current against temperature (device model)', () => {
  /** VBE at which the model's collector current equals `icA` with VCB = 0, by bisection. */
  function vbeAtCurrentV(isA: number, icA: number, temperatureC: number): number {
    const model = npnModel({ family: 'npn', beta: 150, saturationCurrentA: isA }, temperatureC);
    let lo = 0.2;
    let hi = 1.0;
    for (let i = 0; i < 200; i += 1) {
      const mid = (lo + hi) / 2;
      if (model.evaluate(mid, 0, 1).icA < icA) lo = mid;
      else hi = mid;
    }
    return (lo + hi) / 2;
  }

  // The rule of thumb holds for VBE of roughly 0.5 ... 0.7 V. With EG = 1.11 eV and XTI = 3 the
  // model gives dVBE/dT = (VBE − EG − 3·VT)/T, so a device biased to VBE ≈ 0.71 V drifts only
  // ≈ −1.58 mV/K: the rows keep VBE inside the range where the rule of thumb is quoted.
  test.each([
    { isA: 1e-14, icA: 1e-3 },
    { isA: 1e-15, icA: 1e-4 },
    { isA: 5e-15, icA: 1e-5 },
    { isA: 2e-14, icA: 5e-4 },
  ])('IS $isA A at IC $icA A: VBE falls about 2 mV/K near 27 °C (common practice, 1.6 ... 2.4 mV/K)', ({ isA, icA }) => {
    const slopeVPerK = (vbeAtCurrentV(isA, icA, 37) - vbeAtCurrentV(isA, icA, 17)) / 20;
    expect(slopeVPerK).toBeLessThan(-1.6e-3); // common practice: about −2 mV/K
    expect(slopeVPerK).toBeGreaterThan(-2.4e-3);
  });

  test('the slope matches (VBE − EG − 3·VT)/T from differentiating the [SPICE] law (relative 1 %)', () => {
    const isA = 1e-14;
    const icA = 1e-3;
    const vbeV = vbeAtCurrentV(isA, icA, 27);
    const expectedVPerK = (vbeV - 1.11 - 3 * thermalVoltageV(27)) / 300.15; // d/dT of VT·ln(IC/IS(T)) [SPICE]
    const slopeVPerK = (vbeAtCurrentV(isA, icA, 28) - vbeAtCurrentV(isA, icA, 26)) / 2;
    expect(Math.abs(slopeVPerK - expectedVPerK) / Math.abs(expectedVPerK)).toBeLessThan(0.01);
  });
});
