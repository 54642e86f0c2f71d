/**
 * The spec as the review report prints it (features/specs/lib/spec-rows.ts): an object the spec
 * gives inside a card (the PTAT source's PNP transistor, a model card) reads as one row per value,
 * titled and in engineering notation, never as JSON.
 */
import { describe, expect, test } from 'vitest';
import { specGroups } from '../../../web/src/features/specs/lib/spec-rows';

const SPEC = {
  title: 'Fen gauge input',
  device: { beta: 190, pnp: { beta: 110, earlyVoltageV: 46, saturationCurrentA: 6.3e-15 } },
  supply: { positiveV: 9, negativeV: -9 },
  gain: { target: 36 },
  cmrr: { minDb: 66 },
  topologies: ['widlar', 'ptat'],
};

const deviceRows = (document: Record<string, unknown>) => specGroups(document).find((g) => g.title === 'Device')!.rows;

describe('the spec in the report', () => {
  test('the PNP transistor reads as its titled values, each in its unit', () => {
    const rows = deviceRows(SPEC);
    expect(rows.filter((r) => r.path.startsWith('/device/pnp')).map((r) => [r.label, r.value])).toEqual([
      ['PNP current gain (beta)', '110 A/A'],
      ['PNP Early voltage', '46 V'],
      ['PNP saturation current IS', '6.3 fA'],
    ]);
    expect(rows.map((r) => r.value).join()).not.toContain('{');
  });

  test('a spec without a PNP says so in one row', () => {
    const { pnp: _pnp, ...device } = SPEC.device;
    expect(deviceRows({ ...SPEC, device }).find((r) => r.path === '/device/pnp')).toEqual({ path: '/device/pnp', label: 'PNP transistor', value: 'not set' });
  });

  test('the tail options name the PTAT source as the catalogue does', () => {
    const options = specGroups(SPEC).find((g) => g.title === 'Options')!.rows.find((r) => r.path === '/topologies')!;
    expect(options.value).toBe('Widlar source, PTAT (constant-gm) source');
  });
});
