/**
 * The tail-topology catalogue (shared/engine/topologies.ts) against the circuits it describes:
 * the circuit stamp's parts are the ones the catalogue names, each resistor takes the value of
 * the field the catalogue gives it, and each textbook Rout limit is taken at the output
 * transistor, the one whose collector is the tail node ([GM]: a current source's output
 * resistance is the one seen looking into that collector).
 */
import { describe, expect, test } from 'vitest';
import type { CircuitElement } from '#shared/engine/circuit';
import { tailElements } from '#shared/engine/tail-elements';
import { TOPOLOGIES, TOPOLOGY_CATALOGUE, tailRatio, tailValueOhm, topologyName, unhandledTopology } from '#shared/engine/topologies';
import { SPEC_SCHEMA } from '#shared/validate';
import { TAILS } from '../schema/schema-fixtures';

const GUESS = { positiveV: 12, negativeV: -12, tailNodeGuessV: -0.65, vbeGuessV: 0.65 };

describe.each(TAILS.map((tail) => [tail.topology, tail] as const))('%s', (id, tail) => {
  const entry = TOPOLOGY_CATALOGUE[id];
  // stamped afresh in each test, so a mutation run knows which tests exercise the stamp
  const elementsOf = () => tailElements(tail, GUESS).elements;
  const named = (name: string) => elementsOf().find((e) => e.name === name) as CircuitElement;

  test("the circuit stamp's parts are the catalogue's, resistors and transistors", () => {
    const resistors = elementsOf().filter((e) => e.kind === 'resistor').map((e) => e.name);
    const transistors = elementsOf().filter((e) => e.kind === 'npn' || e.kind === 'pnp').map((e) => e.name);
    expect(resistors.sort()).toEqual(entry.resistors.flatMap((r) => r.names).sort());
    expect(transistors.sort()).toEqual(entry.transistors.map((q) => q.name).sort());
  });

  test('each resistor takes the value of its design field', () => {
    for (const resistor of entry.resistors) {
      for (const name of resistor.names) {
        const element = named(name);
        expect(element.kind === 'resistor' && element.resistanceOhm, name).toBe(tailValueOhm(tail, resistor.field));
      }
    }
  });

  test('each area ratio is the emitter area the stamp gives: N on the ΔVBE transistor, the output ratio on the output', () => {
    for (const ratio of entry.ratios) {
      const value = tailRatio(tail, ratio.field);
      const withArea = elementsOf().filter((e) => (e.kind === 'npn' || e.kind === 'pnp') && e.area === value);
      expect(withArea.length, ratio.field).toBeGreaterThan(0);
    }
    const tailWithOutput = { ...tail, outputAreaRatio: 3 } as typeof tail;
    if (entry.ratios.some((r) => r.field === 'outputAreaRatio')) {
      const output = tailElements(tailWithOutput, GUESS).elements.find((e) => e.kind === 'npn' && e.collector === 't');
      expect(output?.kind === 'npn' && output.area).toBe(3);
    }
  });

  test('the Rout limit is taken at the transistor whose collector is the tail node (or at the tail resistor itself)', () => {
    const limit = entry.routLimit;
    if (limit.form === 'resistor') {
      const element = elementsOf().find((e) => e.kind === 'resistor' && e.nodes.includes('t'));
      expect(element?.kind === 'resistor' && element.resistanceOhm).toBe(tailValueOhm(tail, limit.field));
    } else {
      const output = elementsOf().find((e) => e.kind === 'npn' && e.collector === 't');
      expect(output?.name).toBe(limit.transistor);
    }
  });

  test('its words name every part and every field to fill', () => {
    for (const name of [...entry.resistors.flatMap((r) => r.names), ...entry.transistors.map((q) => q.name)]) expect(entry.circuitWords).toContain(name);
    const fields = [...entry.circuitWords.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);
    expect(new Set(fields)).toEqual(new Set([...entry.resistors.map((r) => r.field), ...entry.ratios.map((r) => r.field)]));
  });
});

describe('the catalogue', () => {
  test('has one entry per id, the id its key, and fixtures for every one', () => {
    expect(TOPOLOGIES.map((id) => TOPOLOGY_CATALOGUE[id].id)).toEqual([...TOPOLOGIES]);
    expect(TAILS.map((t) => t.topology)).toEqual([...TOPOLOGIES]);
  });

  test('names and plot lines tell the topologies apart', () => {
    const names = TOPOLOGIES.map(topologyName);
    expect(new Set(names).size).toBe(TOPOLOGIES.length);
    const lines = TOPOLOGIES.map((id) => JSON.stringify(TOPOLOGY_CATALOGUE[id].plotLine));
    expect(new Set(lines).size).toBe(TOPOLOGIES.length);
  });

  test("every topology's family is a device family a spec may name", () => {
    const device = (SPEC_SCHEMA.properties as Record<string, { properties: Record<string, { enum?: string[]; const?: string }> }>).device;
    const family = device.properties.family;
    const families = family.enum ?? [family.const];
    for (const id of TOPOLOGIES) expect(families, id).toContain(TOPOLOGY_CATALOGUE[id].family);
  });

  test('a name for an unknown id is the id in words; none at all is a dash', () => {
    expect(topologyName('something-new')).toBe('something new');
    expect(topologyName(undefined)).toBe('—');
  });

  test('a switch that meets a topology it does not know throws rather than passing it by', () => {
    expect(() => unhandledTopology('bootstrapped' as never)).toThrow(/bootstrapped/);
  });
});
