/**
 * The catalogue's words and helpers (shared/engine/topologies.ts): names that carry the trade's
 * names for each tail [GM: resistor tail, current mirror, Widlar current source, Wilson current
 * mirror, cascode current mirror], roles that say where each part connects (as the contract's
 * table connects them, ENGINE-CONTRACT.md), plot tones the chart theme knows, and the field
 * helpers the schemas and the netlist read.
 */
import { describe, expect, test } from 'vitest';
import { tailElements } from '#shared/engine/tail-elements';
import { TOPOLOGIES, TOPOLOGY_CATALOGUE, isTopologyId, tailFieldsOf, tailRatio, tailRatioFieldsOf, tailValueOhm, topologyName, type TailDesign } from '#shared/engine/topologies';
import { TAILS } from '../schema/schema-fixtures';

const GUESS = { positiveV: 12, negativeV: -12, tailNodeGuessV: -0.65, vbeGuessV: 0.65 };

test('each name carries the trade\'s name for its tail [GM]', () => {
  const expected = { resistor: /^Resistor$/, 'simple-mirror': /mirror/i, 'degenerated-mirror': /degenerated mirror/i, widlar: /Widlar/, wilson: /Wilson mirror/, cascode: /cascode mirror/i, ptat: /PTAT/ };
  for (const id of TOPOLOGIES) expect(topologyName(id), id).toMatch(expected[id]);
  expect(topologyName('simple-mirror')).toBe('Simple mirror');
});

test('each plot tone is one of the four the chart theme draws (never a status hue)', () => {
  for (const id of TOPOLOGIES) expect(['ink', 'ink-soft', 'note', 'accent'], id).toContain(TOPOLOGY_CATALOGUE[id].plotLine.tone);
});

/** Invented values (its output area ratio left to the default). */
const PTAT_TAIL: TailDesign = { topology: 'ptat', emitterResistanceOhm: 330, startupResistanceOhm: 1.5e6, areaRatio: 8 };

describe.each(TAILS.map((tail) => [tail.topology, tail] as const))('%s: roles say where each part connects', (id, tail) => {
  const entry = TOPOLOGY_CATALOGUE[id];
  const elements = () => tailElements(tail, GUESS).elements;

  test('the transistor whose collector is t is the output, and says so', () => {
    const output = elements().find((e) => e.kind === 'npn' && e.collector === 't');
    if (!output) return expect(entry.transistors).toEqual([]);
    const role = entry.transistors.find((q) => q.name === output.name)!.role;
    expect(role).toMatch(/collector at t/);
  });

  test('a diode-connected transistor is called so; a resistor from V+ is called the reference', () => {
    for (const e of elements()) {
      if (e.kind === 'npn' || e.kind === 'pnp') {
        const listed = entry.transistors.find((q) => q.name === e.name)!;
        expect(listed.type ?? 'npn', e.name).toBe(e.kind);
        const role = listed.role;
        expect(role.length, e.name).toBeGreaterThan(5);
        if (e.collector === e.base && e.collector !== 't') expect(role, e.name).toMatch(/diode-connected/i);
      }
      if (e.kind === 'resistor') {
        const role = entry.resistors.find((r) => r.names.includes(e.name))!.role;
        if (e.nodes.includes('vp')) expect(role, e.name).toMatch(/^(Reference|Start-up), V\+ to Q\d/);
        else expect(role, e.name).toMatch(/emitter|t to V−/i);
      }
    }
  });
});

describe('field helpers', () => {
  test('a topology\'s fields in the design schema\'s order, each once though two resistors share it', () => {
    expect(tailFieldsOf('resistor')).toEqual(['resistanceOhm']);
    expect(tailFieldsOf('simple-mirror')).toEqual(['referenceResistanceOhm']);
    expect(tailFieldsOf('degenerated-mirror')).toEqual(['referenceResistanceOhm', 'emitterResistanceOhm']);
    expect(tailFieldsOf('widlar')).toEqual(['referenceResistanceOhm', 'emitterResistanceOhm']);
  });

  test('area ratios: the design\'s, or the catalogue\'s default; one the tail does not have is refused by name', () => {
    expect(tailRatioFieldsOf('ptat')).toEqual(['areaRatio', 'outputAreaRatio']);
    expect(tailRatioFieldsOf('widlar')).toEqual([]);
    expect(tailRatio(PTAT_TAIL, 'areaRatio')).toBe(8);
    expect(tailRatio(PTAT_TAIL, 'outputAreaRatio')).toBe(1);
    expect(tailRatio({ ...PTAT_TAIL, outputAreaRatio: 2 } as TailDesign, 'outputAreaRatio')).toBe(2);
    expect(() => tailRatio({ topology: 'widlar', referenceResistanceOhm: 4700, emitterResistanceOhm: 82 }, 'areaRatio')).toThrow('The widlar tail has no areaRatio');
  });

  test('a field the tail does not have is refused by name', () => {
    expect(() => tailValueOhm({ topology: 'simple-mirror', referenceResistanceOhm: 22000 } as TailDesign, 'emitterResistanceOhm')).toThrow('The simple-mirror tail has no emitterResistanceOhm');
    expect(tailValueOhm({ topology: 'widlar', referenceResistanceOhm: 4700, emitterResistanceOhm: 82 }, 'emitterResistanceOhm')).toBe(82);
  });

  test('only the catalogue\'s ids, spelt exactly, are topology ids', () => {
    for (const id of TOPOLOGIES) expect(isTopologyId(id)).toBe(true);
    for (const other of ['Widlar', 'current-mirror', '', 3, null, undefined, ['widlar']]) expect(isTopologyId(other), String(other)).toBe(false);
  });

  test('an id outside the catalogue reads as its words; null reads as a dash', () => {
    expect(topologyName('bootstrapped-current-source')).toBe('bootstrapped current source');
    expect(topologyName(null)).toBe('—');
  });
});
