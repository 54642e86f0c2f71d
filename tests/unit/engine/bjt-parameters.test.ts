/**
 * The engine's reading of a model card against ngspice's BJT level 1 (src/spicelib/devices/bjt/
 * bjtsetup.c and the ngspice manual's BJT parameter table [SPICE]): a parameter the card leaves
 * out takes ngspice's default; VAF, IKF, VAR and IKR of 0 mean infinite; each parameter's unit
 * is the manual's; a design without a card is the three-parameter device written as a card, its
 * IS from VBE(on) at 1 mA by the diode law IS = I·exp(−VBE/VT) [GM] when IS is not given.
 */
import { describe, expect, test } from 'vitest';
import { BJT_PARAMETERS, BJT_PARAMETER_NAMES, cardOf, hasModelCard, resolvedParameters, type BjtParameterName } from '#shared/engine/bjt-parameters';
import type { DeviceParams } from '#shared/engine/types';

/** ngspice bjtsetup.c defaults (the manual's table lists the same); infinite ones as Infinity. */
const NGSPICE_DEFAULTS: Record<BjtParameterName, number> = {
  IS: 1e-16, BF: 100, NF: 1, VAF: Infinity, IKF: Infinity, ISE: 0, NE: 1.5, BR: 1, NR: 1, VAR: Infinity, IKR: Infinity, ISC: 0, NC: 2,
  RB: 0, RE: 0, RC: 0,
  CJE: 0, VJE: 0.75, MJE: 0.33, CJC: 0, VJC: 0.75, MJC: 0.33, CJS: 0, VJS: 0.75, MJS: 0, FC: 0.5, TF: 0, TR: 0,
  EG: 1.11, XTI: 3, XTB: 0, KF: 0, AF: 1,
};

/**
 * The dimension of each parameter in the ngspice manual's table: A, V, Ω, F, s, eV, or none
 * (the gains BF and BR are current ratios, A/A).
 */
const MANUAL_UNITS: Record<BjtParameterName, string> = {
  IS: 'A', BF: 'A/A', NF: '', VAF: 'V', IKF: 'A', ISE: 'A', NE: '', BR: 'A/A', NR: '', VAR: 'V', IKR: 'A', ISC: 'A', NC: '',
  RB: 'Ω', RE: 'Ω', RC: 'Ω',
  CJE: 'F', VJE: 'V', MJE: '', CJC: 'F', VJC: 'V', MJC: '', CJS: 'F', VJS: 'V', MJS: '', FC: '', TF: 's', TR: 's',
  EG: 'eV', XTI: '', XTB: '', KF: '', AF: '',
};

/** A word of each parameter's description in the ngspice manual's table, which the meaning must carry. */
const MANUAL_WORDS: Record<BjtParameterName, RegExp> = {
  IS: /saturation current/, BF: /forward.*gain/, NF: /forward.*emission/, VAF: /forward Early/, IKF: /forward.*roll-off/,
  ISE: /base-emitter leakage saturation/, NE: /base-emitter leakage emission/, BR: /reverse.*gain/, NR: /reverse.*emission/,
  VAR: /reverse Early/, IKR: /reverse.*roll-off/, ISC: /base-collector leakage saturation/, NC: /base-collector leakage emission/,
  RB: /base resistance/, RE: /emitter resistance/, RC: /collector resistance/,
  CJE: /base-emitter.*capacitance/, VJE: /base-emitter built-in/, MJE: /base-emitter.*exponent/,
  CJC: /base-collector.*capacitance/, VJC: /base-collector built-in/, MJC: /base-collector.*exponent/,
  CJS: /substrate.*capacitance/, VJS: /substrate.*built-in/, MJS: /substrate.*exponent/,
  FC: /forward-bias depletion capacitance/, TF: /forward transit time/, TR: /reverse transit time/,
  EG: /energy gap/, XTI: /temperature exponent for IS/, XTB: /beta temperature exponent/, KF: /flicker-noise coefficient/, AF: /flicker-noise exponent/,
};

describe('a card\u2019s parameters as ngspice reads them', () => {
  test('an empty card resolves to ngspice\u2019s default for every parameter', () => {
    expect(resolvedParameters({})).toEqual(NGSPICE_DEFAULTS);
  });

  test('each parameter\u2019s stated default, unit and description follow the manual\u2019s table', () => {
    expect([...BJT_PARAMETER_NAMES].sort()).toEqual(Object.keys(NGSPICE_DEFAULTS).sort());
    for (const name of BJT_PARAMETER_NAMES) {
      expect(BJT_PARAMETERS[name].default, name).toBe(NGSPICE_DEFAULTS[name]);
      expect(BJT_PARAMETERS[name].unit, name).toBe(MANUAL_UNITS[name]);
      expect(BJT_PARAMETERS[name].meaning, name).toMatch(MANUAL_WORDS[name]);
    }
  });

  test('VAF, IKF, VAR and IKR of 0 read as infinite; a 0 elsewhere stays 0; given values are kept', () => {
    const zeros = Object.fromEntries(BJT_PARAMETER_NAMES.map((name) => [name, 0]));
    const resolved = resolvedParameters(zeros);
    for (const name of BJT_PARAMETER_NAMES) {
      const infinite = ['VAF', 'IKF', 'VAR', 'IKR'].includes(name);
      expect(resolved[name], name).toBe(infinite ? Infinity : 0);
      expect(BJT_PARAMETERS[name].zeroMeansInfinite === true, name).toBe(infinite);
    }
    expect(resolvedParameters({ VAF: 74, IKF: 0.045, CJE: 2e-12 })).toMatchObject({ VAF: 74, IKF: 0.045, CJE: 2e-12, IS: 1e-16 });
  });
});

describe('whether a device carries a card', () => {
  test.each([
    ['no model', undefined, false],
    ['an empty model', {}, false],
    ['only blank fields', { IS: undefined, BF: undefined }, false],
    ['one parameter given', { BF: 120 }, true],
    ['one blank field beside a given one', { IS: undefined, VAF: 0 }, true],
  ] as const)('%s: %s', (_name, model, expected) => {
    expect(hasModelCard({ model })).toBe(expected);
  });
});

describe('the card a design\u2019s device stands for', () => {
  const VT_27_V = (1.380649e-23 * 300.15) / 1.602176634e-19; // kT/q at 27 °C [SI]

  test('a device with a card gives a copy of it, nothing defaulted', () => {
    const model = { BF: 150, CJE: 1e-12 };
    const card = cardOf({ family: 'npn', beta: 150, model } as DeviceParams);
    expect(card).toEqual({ BF: 150, CJE: 1e-12 });
    expect(card).not.toBe(model);
  });

  test('without a card: IS, BF and VAF of the three-parameter device', () => {
    expect(cardOf({ family: 'npn', beta: 180, earlyVoltageV: 90, saturationCurrentA: 2e-15 } as DeviceParams)).toEqual({ IS: 2e-15, BF: 180, VAF: 90 });
  });

  test('an empty model is no card: the three-parameter device applies', () => {
    expect(cardOf({ family: 'npn', beta: 180, earlyVoltageV: 90, saturationCurrentA: 2e-15, model: {} } as DeviceParams)).toEqual({ IS: 2e-15, BF: 180, VAF: 90 });
  });

  test('without IS, beta or an Early voltage: IS puts VBE at vbeOnV for 1 mA (IS = 1 mA·exp(−VBE/VT)), BF 100, no VAF', () => {
    const card = cardOf({ family: 'npn', vbeOnV: 0.62 } as DeviceParams);
    expect(Object.keys(card).sort()).toEqual(['BF', 'IS']);
    expect(card.BF).toBe(100);
    expect(card.IS! / (1e-3 * Math.exp(-0.62 / VT_27_V)) - 1).toBeCloseTo(0, 9);
  });

  test.each([
    ['IS absent', undefined],
    ['IS of 0 (not a device)', 0],
  ])('%s and no vbeOnV: VBE(on) is 0.65 V at 1 mA (common practice for small-signal silicon)', (_name, saturationCurrentA) => {
    const card = cardOf({ family: 'npn', beta: 100, saturationCurrentA } as DeviceParams);
    expect(card.IS! / (1e-3 * Math.exp(-0.65 / VT_27_V)) - 1).toBeCloseTo(0, 9);
  });
});
