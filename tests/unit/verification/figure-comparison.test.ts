/**
 * The SPICE check's comparison of one figure: differences worked out here by hand from the
 * contract's tolerances (ENGINE-CONTRACT.md, version 2: offset voltage 3 % or 20 µV, drift 5 % or
 * 0.1 µV/°C, whichever is larger), and the rows listed without a verdict.
 */
import { describe, expect, test } from 'vitest';
import { absoluteFigure, flooredFigure, notCompared, percentFigure } from '../../../api/verification/figure-comparison';

const offset = { key: 'inputOffsetVoltageV', label: 'Input offset voltage', unit: 'V', group: 'input' as const };

describe('a floored tolerance: the larger of a percentage of ngspice’s value and a floor', () => {
  test.each([
    // [engine, ngspice, tolerance by hand, agrees]
    [2.05e-3, 2.0e-3, 60e-6, true], // 3 % of 2 mV = 60 µV > 20 µV; 50 µV off
    [2.07e-3, 2.0e-3, 60e-6, false], // 70 µV off
    [115e-6, 100e-6, 20e-6, true], // 3 % of 100 µV = 3 µV < 20 µV: the floor; 15 µV off
    [-95e-6, -120e-6, 20e-6, false], // 25 µV off, floor 20 µV
  ])('engine %s V, ngspice %s V: tolerance %s V', (engine, spice, tolerance, agrees) => {
    const f = flooredFigure(offset, engine, spice, 3, 20e-6, 'basis');
    expect(f.deltaKind).toBe('absolute');
    expect(f.delta).toBeCloseTo(engine - spice, 15);
    expect(f.tolerance).toBeCloseTo(tolerance, 15);
    expect(f.agrees).toBe(agrees);
    expect(f.group).toBe('input');
    expect(f.toleranceBasis).toBe('basis');
  });

  test('drift: 5 % of 4 µV/°C is 0.2 µV/°C, above the 0.1 µV/°C floor', () => {
    const f = flooredFigure({ key: 'offsetDriftVPerC', label: 'Offset drift', unit: 'V/°C' }, 4.15e-6, 4e-6, 5, 0.1e-6, 'basis');
    expect(f.tolerance).toBeCloseTo(0.2e-6, 15);
    expect(f.agrees).toBe(true);
  });
});

describe('percentages and decibels', () => {
  test('percent: (engine − ngspice)/|ngspice|, 3.2 % off a 3 % tolerance disagrees', () => {
    const f = percentFigure({ key: 'inputBiasCurrentA', label: 'Input bias current', unit: 'A' }, 1.032e-6, 1e-6, 3);
    expect(f.delta).toBeCloseTo(3.2, 10);
    expect(f.agrees).toBe(false);
  });

  test('dB: PSRR 1.4 dB off a 1.5 dB tolerance agrees', () => {
    const f = absoluteFigure({ key: 'psrrDb.positive.singleEnded', label: 'PSRR', unit: 'dB' }, 41.4, 40, 1.5, 'db');
    expect(f.delta).toBeCloseTo(1.4, 10);
    expect(f.agrees).toBe(true);
  });

  test('a side missing: no difference and no verdict', () => {
    expect(percentFigure({ key: 'k', label: 'l', unit: 'Hz' }, null, 1e6, 10).agrees).toBeNull();
    expect(percentFigure({ key: 'k', label: 'l', unit: 'Hz' }, 1e6, null, 10).delta).toBeNull();
  });
});

describe('rows without a verdict', () => {
  test('not predicted: the simulated value stays, the difference and verdict go, whatever they were', () => {
    const compared = percentFigure({ key: 'inputResistanceOhm', label: 'Input resistance', unit: 'Ohm' }, 50_000, 10_000, 5);
    const row = notCompared(compared, 'not-predicted');
    expect(row.simulated).toBe(10_000);
    expect(row.delta).toBeNull();
    expect(row.agrees).toBeNull();
    expect(row.notCompared).toBe('not-predicted');
  });
});
