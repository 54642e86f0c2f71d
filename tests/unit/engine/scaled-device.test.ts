/**
 * A mismatched transistor's device (shared/engine/analyze.ts scaledDevice): its BF and VAF are
 * the stage's times their scales, everything else kept; an Early voltage SPICE reads as infinite
 * (VAF omitted or 0 [SPICE]) stays infinite whatever its scale. Values are invented.
 */
import { describe, expect, test } from 'vitest';
import { scaledDevice } from '#shared/engine/analyze';
import type { DeviceParams } from '#shared/engine/types';

describe('scaledDevice', () => {
  test('three parameters: beta and the Early voltage times their scales, IS kept', () => {
    const device = { family: 'npn', beta: 120, earlyVoltageV: 50, saturationCurrentA: 2e-14 } as DeviceParams;
    const scaled = scaledDevice(device, 1.1, 0.9);
    expect(scaled.beta).toBeCloseTo(132, 12);
    expect(scaled.earlyVoltageV).toBeCloseTo(45, 12);
    expect(scaled.saturationCurrentA).toBe(2e-14);
    expect(scaled.family).toBe('npn');
    // the stage's own device is left as it was
    expect(device).toEqual({ family: 'npn', beta: 120, earlyVoltageV: 50, saturationCurrentA: 2e-14 });
    // scales of 1: the same figures
    expect(scaledDevice(device)).toMatchObject({ beta: 120, earlyVoltageV: 50 });
  });

  test('an Early voltage of 0 or none (infinite) is not scaled', () => {
    expect(scaledDevice({ family: 'npn', beta: 100, earlyVoltageV: 0 } as DeviceParams, 1, 1.2).earlyVoltageV).toBe(0);
    expect(scaledDevice({ family: 'npn', beta: 100 } as DeviceParams, 1, 1.2).earlyVoltageV).toBeUndefined();
  });

  test('a card: its BF and VAF scaled, every other card parameter kept, the three-parameter fields cleared', () => {
    const device = { family: 'npn', beta: 200, earlyVoltageV: 60, model: { IS: 1e-14, BF: 200, VAF: 60, CJC: 3e-12 } } as DeviceParams;
    const scaled = scaledDevice(device, 0.95, 1.05);
    expect(scaled.model!.BF).toBeCloseTo(190, 12);
    expect(scaled.model!.VAF).toBeCloseTo(63, 12);
    expect(scaled.model!.IS).toBe(1e-14);
    expect(scaled.model!.CJC).toBe(3e-12);
    expect(scaled.beta).toBeUndefined();
    expect(scaled.earlyVoltageV).toBeUndefined();
    expect(device.model!.BF).toBe(200);
  });

  test('a card without VAF keeps it infinite (absent) whatever the scale', () => {
    const scaled = scaledDevice({ family: 'npn', model: { IS: 1e-14, BF: 150 } } as DeviceParams, 1.02, 1.3);
    expect(scaled.model!.BF).toBeCloseTo(153, 12);
    expect(scaled.model!.VAF).toBeUndefined();
  });
});
