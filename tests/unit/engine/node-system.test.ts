/**
 * The node system's indexing of a stage circuit (shared/engine/node-system.ts) as ngspice builds
 * a BJT's nodes [SPICE] bjtsetup.c: with RB, RE, RC a transistor gets internal nodes b', e', c'
 * joined to its terminals by RB/A, RE/A, RC/A (A its area factor), and its substrate junction
 * (ISS = 0) leaves GMIN = 1e-12 S from the internal collector to the substrate; without them the
 * junctions sit at the terminals. Element names come from the stage (circuit.ts).
 */
import { describe, expect, test } from 'vitest';
import { stageCircuit } from '#shared/engine/circuit';
import { indexCircuit } from '#shared/engine/node-system';
import type { Design } from '#shared/engine/types';

const DESIGN: Design = {
  device: { family: 'npn', beta: 150, earlyVoltageV: 80, saturationCurrentA: 1e-14 },
  supply: { positiveV: 12, negativeV: -12 },
  collectorResistanceOhm: 10000,
  tail: { topology: 'resistor', resistanceOhm: 11000 },
  inputCommonModeV: 0,
  tailCapacitanceF: 1e-12,
  pairSaturationCurrentMismatch: 0.2, // Q2 of area 1.2
};

describe('indexing a stage', () => {
  test('without ohmic resistances: the circuit\u2019s resistors, a GMIN from each collector to the substrate, its capacitors; no internal node', () => {
    const ic = indexCircuit(stageCircuit(DESIGN));
    expect(ic.resistors.map((r) => r.name)).toEqual(['RC1', 'RC2', 'Q1.GSUB', 'Q2.GSUB', 'RT']);
    expect(ic.resistors.filter((r) => r.name.endsWith('.GSUB')).map((r) => r.conductanceS)).toEqual([1e-12, 1e-12]);
    expect(ic.capacitors.map((c) => [c.name, c.capacitanceF])).toEqual([['CT', 1e-12]]);
    expect(ic.freeNodes.filter((n) => n.includes("'"))).toEqual([]);
    expect(ic.terminalOf.every((t) => t === undefined)).toBe(true);
  });

  test('with RB, RE and RC: internal nodes behind each, joined by RB/A, RE/A, RC/A', () => {
    const ic = indexCircuit(stageCircuit(DESIGN), { baseOhm: 120, emitterOhm: 1.5, collectorOhm: 20 });
    const q2 = Object.fromEntries(ic.resistors.filter((r) => r.name.startsWith('Q2.')).map((r) => [r.name, r.conductanceS]));
    expect(Object.keys(q2).sort()).toEqual(['Q2.GSUB', 'Q2.RB', 'Q2.RC', 'Q2.RE']);
    expect(q2['Q2.RB']).toBeCloseTo(1.2 / 120, 15);
    expect(q2['Q2.RE']).toBeCloseTo(1.2 / 1.5, 15);
    expect(q2['Q2.RC']).toBeCloseTo(1.2 / 20, 15);
    const q1 = ic.transistors.find((q) => q.name === 'Q1')!;
    expect([ic.freeNodes[q1.bi], ic.freeNodes[q1.ei], ic.freeNodes[q1.ci]]).toEqual(["Q1:b'", "Q1:e'", "Q1:c'"]);
    expect(ic.terminalOf[q1.bi]).toBe(ic.nodeRef('in1'));
    expect(ic.terminalOf[q1.ci]).toBe(ic.nodeRef('c1'));
    // the substrate GMIN hangs on the internal collector
    const gsub = ic.resistors.find((r) => r.name === 'Q1.GSUB')!;
    expect([gsub.a, gsub.b]).toEqual([q1.ci, ic.nodeRef('vn')]);
  });

  test('a node the circuit does not have is refused by name', () => {
    const ic = indexCircuit(stageCircuit(DESIGN));
    expect(() => ic.nodeRef('c9')).toThrow('no node c9');
    expect(ic.nodeRef('vp')).toBeLessThan(0);
    expect(ic.nodeRef('c1')).toBeGreaterThanOrEqual(0);
  });
});
