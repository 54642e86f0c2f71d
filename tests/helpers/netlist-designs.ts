/**
 * The designs the netlist writer's tests (tests/unit/engine/netlist.test.ts) and ngspice's runs
 * of its netlists (tests/reference/netlist-runs.test.ts) share: one sized tail of each topology
 * on ±9 V, invented values.
 */
import type { Design, DeviceParams, TailDesign, TopologyId } from '#shared/engine/types';

export const NETLIST_DEVICE: DeviceParams = { family: 'npn', beta: 165, earlyVoltageV: 92, saturationCurrentA: 1.1e-14, pnp: { beta: 85, earlyVoltageV: 48, saturationCurrentA: 6e-15 } };

export const NETLIST_TAILS: Record<TopologyId, TailDesign> = {
  resistor: { topology: 'resistor', resistanceOhm: 5100 },
  'simple-mirror': { topology: 'simple-mirror', referenceResistanceOhm: 16000 },
  'degenerated-mirror': { topology: 'degenerated-mirror', referenceResistanceOhm: 15000, emitterResistanceOhm: 680 },
  widlar: { topology: 'widlar', referenceResistanceOhm: 11000, emitterResistanceOhm: 270 },
  wilson: { topology: 'wilson', referenceResistanceOhm: 15000 },
  cascode: { topology: 'cascode', referenceResistanceOhm: 15000 },
  ptat: { topology: 'ptat', emitterResistanceOhm: 150, startupResistanceOhm: 820000, areaRatio: 8 },
};

/** A design with the topology's tail, the shared device and rails, and any fields overridden. */
export function netlistDesign(topology: TopologyId, overrides: Partial<Design> = {}): Design {
  return {
    device: NETLIST_DEVICE,
    supply: { positiveV: 9, negativeV: -9 },
    collectorResistanceOhm: 6200,
    tail: NETLIST_TAILS[topology],
    inputCommonModeV: 0.5,
    temperatureC: 27,
    ...overrides,
  };
}
