import { describe, expect, test } from 'vitest';
import specSchema from '#shared/schema/spec.schema.json';
import { diffJson } from '#shared/json-diff';
import { pathLabel, readableChanges } from '../../../web/src/features/specs/lib/spec-changes';

describe('pathLabel', () => {
  test.each([
    [['supply', 'negativeV'], 'Supply › Negative rail'],
    [['cmrr', 'minDb'], 'Rejection › Minimum CMRR'],
    [['tailCapacitanceF'], 'Rejection › Tail capacitance'],
    [['title'], 'Title'],
    [['topologies'], 'Options › Tail options'],
    [['topologies', '2'], 'Options › Tail options › item 3'],
    [['device', 'earlyVoltageV'], 'Device › Early voltage'],
    [['unknownThing'], 'unknownThing'],
  ])('%j reads "%s"', (segments, label) => {
    expect(pathLabel(specSchema, segments)).toBe(label);
  });
});

describe('readableChanges', () => {
  const v1 = { title: 'A', supply: { positiveV: 12, negativeV: -12 }, cmrr: { minDb: 80, atFrequencyHz: 0 }, topologies: ['resistor', 'wilson', 'cascode'], tailCapacitanceF: 0 };
  const v2 = { title: 'A', supply: { positiveV: 12, negativeV: -15 }, cmrr: { minDb: 80, atFrequencyHz: 1000 }, topologies: ['resistor', 'cascode'], tailCurrentA: 0.0015, tailCapacitanceF: 2e-12 };
  const rows = readableChanges(specSchema, diffJson(v1, v2), v1, v2);

  test('each changed field is one row, in the order of the form, with units and words', () => {
    expect(rows).toEqual([
      { path: '/supply/negativeV', label: 'Supply › Negative rail', kind: 'changed', before: '−12 V', after: '−15 V' },
      { path: '/cmrr/atFrequencyHz', label: 'Rejection › At frequency', kind: 'changed', before: '0 Hz', after: '1 kHz' },
      { path: '/tailCapacitanceF', label: 'Rejection › Tail capacitance', kind: 'changed', before: '0 F', after: '2 pF' },
      { path: '/tailCurrentA', label: 'Output & power › Tail current', kind: 'added', before: 'not set', after: '1.5 mA' },
      {
        path: '/topologies',
        label: 'Options › Tail options',
        kind: 'changed',
        before: 'Resistor, Wilson mirror, Cascode mirror',
        after: 'Resistor, Cascode mirror',
        detail: 'Wilson mirror left out',
      },
    ]);
  });

  test('a field taken out is marked removed, with its old value', () => {
    const [row] = readableChanges(specSchema, diffJson(v2, { ...v2, tailCurrentA: undefined }), v2, {});
    expect(row).toMatchObject({ label: 'Output & power › Tail current', kind: 'removed', before: '1.5 mA', after: 'not set' });
  });
});

describe('readableChanges of the optional targets and corners', () => {
  const v1 = {
    title: 'A',
    noise: { maxVPerRtHz: 8e-9, atFrequencyHz: 1000 },
    offset: { driftMaxVPerC: 5e-6, sigmas: 3 },
    supplyTolerance: { positivePercent: 5, negativePercent: 5 },
    resistors: { series: 'E96', tolerancePercent: 1, tempcoPpmPerC: 100 },
  };
  const v2 = {
    title: 'A',
    noise: { maxVPerRtHz: 6e-9, atFrequencyHz: 1000 },
    offset: { driftMaxVPerC: 5e-6, sigmas: 3 },
    slewRateMinVPerS: 2e6,
    psrrMinDb: { negative: 55 },
    supplyTolerance: { positivePercent: 5, negativePercent: 10 },
    betaRange: { min: 80 },
    resistors: { series: 'E96', tolerancePercent: 1, tempcoPpmPerC: 25 },
  };

  test('each reads with its card, its title and its unit, in the order of the form', () => {
    expect(readableChanges(specSchema, diffJson(v1, v2), v1, v2)).toEqual([
      { path: '/supplyTolerance/negativePercent', label: 'Supply › Tolerance of the negative rail', kind: 'changed', before: '5 %', after: '10 %' },
      { path: '/psrrMinDb/negative', label: 'Rejection › PSRR of the negative rail', kind: 'added', before: 'not set', after: '55 dB' },
      { path: '/noise/maxVPerRtHz', label: 'Input › Largest noise density', kind: 'changed', before: '8 nV/√Hz', after: '6 nV/√Hz' },
      // 2 V/µs is 2 MV/s [SI]
      { path: '/slewRateMinVPerS', label: 'Speed › Lowest slew rate', kind: 'added', before: 'not set', after: '2 MV/s' },
      { path: '/betaRange/min', label: 'Device › Lowest current gain', kind: 'added', before: 'not set', after: '80 A/A' },
      { path: '/resistors/tempcoPpmPerC', label: 'Resistors › Temperature coefficient', kind: 'changed', before: '100 ppm/°C', after: '25 ppm/°C' },
    ]);
  });
});
