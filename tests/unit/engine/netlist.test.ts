/**
 * The SPICE netlist writer (shared/engine/netlist.ts): structure, node connections against the
 * contract's circuit table (ENGINE-CONTRACT.md), read back through `parseNetlistElements`.
 * ngspice's runs of every topology, checked against hand formulas, are in
 * tests/reference/netlist-runs.test.ts: no simulator starts here.
 */
import { describe, expect, test } from 'vitest';
import { stageCircuit } from '#shared/engine/circuit';
import { nominalSaturationCurrentA } from '#shared/engine/device';
import {
  PNP_MODEL_NAME,
  SPICE_MODEL_NAME,
  TAIL_TEST_SOURCE,
  parseNetlistElements,
  spiceNetlist,
  type NetlistOptions,
  type ParsedElement,
} from '#shared/engine/netlist';
import { TOPOLOGIES, type DeviceParams, type TailDesign, type TopologyId } from '#shared/engine/types';
import { NETLIST_DEVICE, netlistDesign as designFor } from '../../helpers/netlist-designs';
import { parseSpiceNumber } from '#shared/units/spice-number';


const AC_SWEEP = { startHz: 1, stopHz: 1e10, pointsPerDecade: 50 };
const ANALYSES: NetlistOptions[] = [
  { analysis: 'op' },
  { analysis: 'ac-differential', ...AC_SWEEP },
  { analysis: 'ac-common-mode', ...AC_SWEEP },
  { analysis: 'ac-tail', tailNodeV: -0.2, ...AC_SWEEP },
  { analysis: 'op', differentialInputV: 0.002 },
  { analysis: 'dc-differential', startV: -0.1, stopV: 0.1, stepV: 0.001 },
  { analysis: 'ac-rail', rail: 'negative', ...AC_SWEEP },
  { analysis: 'noise', ...AC_SWEEP },
  { analysis: 'tran-step', fromV: -1, toV: 1, delayS: 1e-9, stepS: 1e-10, stopS: 1e-6 },
];

type ParsedQ = Extract<ParsedElement, { kind: 'Q' }>;
type ParsedR = Extract<ParsedElement, { kind: 'R' }>;
type ParsedV = Extract<ParsedElement, { kind: 'V' }>;

function transistor(elements: ParsedElement[], name: string): ParsedQ {
  const found = elements.find((e): e is ParsedQ => e.kind === 'Q' && e.name === name);
  if (!found) throw new Error(`no transistor ${name} in the netlist`);
  return found;
}

function source(elements: ParsedElement[], name: string): ParsedV {
  const found = elements.find((e): e is ParsedV => e.kind === 'V' && e.name === name);
  if (!found) throw new Error(`no source ${name} in the netlist`);
  return found;
}

/** Resistors joining nodes a and b, either way round. */
function resistorsBetween(elements: ParsedElement[], a: string, b: string): ParsedR[] {
  return elements.filter(
    (e): e is ParsedR => e.kind === 'R' && ((e.nodes[0] === a && e.nodes[1] === b) || (e.nodes[0] === b && e.nodes[1] === a)),
  );
}

/** The one resistor between a and b, with its value checked. */
function expectResistor(elements: ParsedElement[], a: string, b: string, valueOhm: number): void {
  const found = resistorsBetween(elements, a, b);
  expect(found, `one resistor between ${a} and ${b}`).toHaveLength(1);
  expect(found[0].valueOhm).toBe(valueOhm);
}

/** The NPN card's parameters (the stage's one NPN card; a PTAT tail adds the PNP's, `QPNP`, checked on its own). */
function modelParameters(netlist: string): Record<string, number> {
  const cards = netlist.split('\n').filter((line) => /^\.model\s+\S+\s+npn\b/i.test(line));
  expect(cards).toHaveLength(1);
  const match = /^\.model\s+(\S+)\s+npn\s*\((.*)\)\s*$/i.exec(cards[0]);
  expect(match, cards[0]).not.toBeNull();
  expect(match![1]).toBe(SPICE_MODEL_NAME);
  return Object.fromEntries(
    match![2]
      .trim()
      .split(/\s+/)
      .map((pair) => pair.split('='))
      .map(([key, value]) => [key.toUpperCase(), parseSpiceNumber(value)]),
  );
}

/** Analysis cards: `.op`, `.ac`, `.dc`, `.tran`, `.noise`, … as whole first words (not `.options`). */
function analysisCards(netlist: string): string[] {
  return netlist.split('\n').filter((line) => /^\.(op|ac|dc|tran|noise|tf|pz|disto|sens)(\s|$)/i.test(line));
}

/** Contract table (ENGINE-CONTRACT.md, "Tail elements"), checked on the parsed netlist. */
const CONTRACT_CONNECTIONS: Record<TopologyId, (elements: ParsedElement[], tail: TailDesign) => void> = {
  resistor: (elements, tail) => {
    expectResistor(elements, 't', 'vn', (tail as { resistanceOhm: number }).resistanceOhm);
  },
  'simple-mirror': (elements, tail) => {
    const q3 = transistor(elements, 'Q3');
    const q4 = transistor(elements, 'Q4');
    expect(q3.collector, 'Q3 diode-connected').toBe(q3.base);
    expectResistor(elements, 'vp', q3.collector, (tail as { referenceResistanceOhm: number }).referenceResistanceOhm);
    expect(q3.emitter).toBe('vn');
    expect(q4.base, "Q4 shares Q3's base").toBe(q3.base);
    expect(q4.emitter).toBe('vn');
    expect(q4.collector).toBe('t');
  },
  'degenerated-mirror': (elements, tail) => {
    const { referenceResistanceOhm, emitterResistanceOhm } = tail as { referenceResistanceOhm: number; emitterResistanceOhm: number };
    const q3 = transistor(elements, 'Q3');
    const q4 = transistor(elements, 'Q4');
    expect(q3.collector).toBe(q3.base);
    expectResistor(elements, 'vp', q3.collector, referenceResistanceOhm);
    expect(q4.base).toBe(q3.base);
    expect(q4.collector).toBe('t');
    expect(q3.emitter).not.toBe(q4.emitter);
    expectResistor(elements, q3.emitter, 'vn', emitterResistanceOhm);
    expectResistor(elements, q4.emitter, 'vn', emitterResistanceOhm);
  },
  widlar: (elements, tail) => {
    const { referenceResistanceOhm, emitterResistanceOhm } = tail as { referenceResistanceOhm: number; emitterResistanceOhm: number };
    const q3 = transistor(elements, 'Q3');
    const q4 = transistor(elements, 'Q4');
    expect(q3.collector).toBe(q3.base);
    expectResistor(elements, 'vp', q3.collector, referenceResistanceOhm);
    expect(q3.emitter, 'only Q4 has an emitter resistor').toBe('vn');
    expect(q4.base).toBe(q3.base);
    expect(q4.collector).toBe('t');
    expectResistor(elements, q4.emitter, 'vn', emitterResistanceOhm);
  },
  wilson: (elements, tail) => {
    const q3 = transistor(elements, 'Q3');
    const q4 = transistor(elements, 'Q4');
    const q5 = transistor(elements, 'Q5');
    expectResistor(elements, 'vp', q3.collector, (tail as { referenceResistanceOhm: number }).referenceResistanceOhm);
    expect(q3.emitter).toBe('vn');
    expect(q5.collector).toBe('t');
    expect(q5.base, "Q5's base at Q3's collector").toBe(q3.collector);
    expect(q5.emitter).toBe('x');
    expect([q4.collector, q4.base], 'Q4 diode-connected at x').toEqual(['x', 'x']);
    expect(q4.emitter).toBe('vn');
    expect(q3.base, "Q3's base tied to x").toBe('x');
  },
  cascode: (elements, tail) => {
    const q3 = transistor(elements, 'Q3');
    const q4 = transistor(elements, 'Q4');
    const q5 = transistor(elements, 'Q5');
    const q6 = transistor(elements, 'Q6');
    expect(q3.collector, 'Q3 diode-connected').toBe(q3.base);
    expect(q3.emitter).toBe('vn');
    expect(q4.base).toBe(q3.base);
    expect(q4.emitter).toBe('vn');
    expect(q5.collector, 'Q5 diode-connected').toBe(q5.base);
    expect(q5.emitter, "Q5 stacked on Q3's collector").toBe(q3.collector);
    expectResistor(elements, 'vp', q5.collector, (tail as { referenceResistanceOhm: number }).referenceResistanceOhm);
    expect(q6.emitter, "Q6 stacked on Q4's collector").toBe(q4.collector);
    expect(q6.base, "Q6's base tied to Q5's base").toBe(q5.base);
    expect(q6.collector).toBe('t');
  },
  ptat: (elements, tail) => {
    const { emitterResistanceOhm, startupResistanceOhm, areaRatio } = tail as { emitterResistanceOhm: number; startupResistanceOhm: number; areaRatio: number };
    const [q3, q4, q7, q8, q9] = ['Q3', 'Q4', 'Q7', 'Q8', 'Q9'].map((name) => transistor(elements, name));
    expect(q3.collector, 'Q3 diode-connected').toBe(q3.base);
    expect(q3.emitter).toBe('vn');
    expect(q4.base, "Q4 shares Q3's base").toBe(q3.base);
    expect(q4.area, 'Q4 is N times Q3').toBe(areaRatio);
    expectResistor(elements, q4.emitter, 'vn', emitterResistanceOhm);
    for (const q of [q7, q8]) {
      expect(q.model, `${q.name} is the PNP`).toBe(PNP_MODEL_NAME);
      expect(q.emitter, `${q.name} from the positive rail`).toBe('vp');
    }
    expect(q8.collector, 'Q8 diode-connected').toBe(q8.base);
    expect(q8.collector, "Q8 on Q4's collector").toBe(q4.collector);
    expect(q7.base).toBe(q8.base);
    expect(q7.collector, 'Q7 feeds Q3').toBe(q3.collector);
    expectResistor(elements, 'vp', q3.collector, startupResistanceOhm);
    expect(q9.base, "Q9 shares Q3's base").toBe(q3.base);
    expect(q9.emitter).toBe('vn');
    expect(q9.collector).toBe('t');
    expect(q9.area, 'output area ratio, 1 by default').toBe(1);
  },
};

describe('spiceNetlist: structure', () => {
  test.each(TOPOLOGIES.flatMap((topology) => ANALYSES.map((options) => ({ topology, options }))))(
    '$topology, $options.analysis: sections, one model card, one analysis card, .end',
    ({ topology, options }) => {
      const netlist = spiceNetlist(designFor(topology), options);
      const lines = netlist.trimEnd().split('\n');
      expect(lines[0]).not.toMatch(/^[.*+]/);
      for (const header of ['* --- supplies ---', '* --- input drive ---', '* --- pair and loads ---', `* --- tail element (${topology}) ---`]) {
        expect(lines).toContain(header);
      }
      expect(lines[lines.length - 1]).toBe('.end');
      modelParameters(netlist);
      const cards = analysisCards(netlist);
      expect(cards).toHaveLength(1);
      const expected: Record<NetlistOptions['analysis'], string> = {
        op: '.op',
        'ac-differential': '.ac dec 50 1 10000000000',
        'ac-common-mode': '.ac dec 50 1 10000000000',
        'ac-tail': '.ac dec 50 1 10000000000',
        'ac-rail': '.ac dec 50 1 10000000000',
        noise: '.noise v(c1,c2) VD dec 50 1 10000000000',
        'dc-differential': '.dc VD -0.1 0.1 0.001',
        'tran-step': '.tran 1e-10 0.000001 0 1e-10',
      };
      expect(cards[0]).toBe(expected[options.analysis]);
    },
  );

  test.each(TOPOLOGIES)('%s: every element of stageCircuit is written with its nodes and value', (topology) => {
    const design = designFor(topology, {
      pairEmitterResistanceOhm: 120,
      collectorMismatch: 0.01,
      pairSaturationCurrentMismatch: 0.02,
      tailCapacitanceF: 4.7e-12,
    });
    const parsed = parseNetlistElements(spiceNetlist(design, { analysis: 'op' }));
    const circuit = stageCircuit(design);
    expect(parsed.filter((e) => e.kind !== 'V')).toHaveLength(circuit.elements.length);
    for (const element of circuit.elements) {
      const found = parsed.find((e) => e.name === element.name);
      expect(found, element.name).toBeDefined();
      if (element.kind === 'resistor') expect(found).toEqual({ kind: 'R', name: element.name, nodes: element.nodes, valueOhm: element.resistanceOhm });
      if (element.kind === 'capacitor') expect(found).toEqual({ kind: 'C', name: element.name, nodes: element.nodes, valueF: element.capacitanceF });
      if (element.kind === 'npn' || element.kind === 'pnp') {
        expect(found).toEqual({
          kind: 'Q',
          name: element.name,
          collector: element.collector,
          base: element.base,
          emitter: element.emitter,
          substrate: 'vn', // every substrate at the negative rail (contract, version 2)
          model: element.kind === 'pnp' ? PNP_MODEL_NAME : SPICE_MODEL_NAME,
          area: element.area,
        });
      }
    }
  });

  test.each(TOPOLOGIES)('%s: tail element connected as the contract table says', (topology) => {
    const design = designFor(topology);
    const elements = parseNetlistElements(spiceNetlist(design, { analysis: 'op' }));
    CONTRACT_CONNECTIONS[topology](elements, design.tail);
  });

  test.each([
    { degenerationOhm: 0, q1Emitter: 't', q2Emitter: 't' },
    { degenerationOhm: 150, q1Emitter: 'e1', q2Emitter: 'e2' },
  ])('pair: bases at in1/in2, loads from vp, emitters to t (degeneration $degenerationOhm Ω)', ({ degenerationOhm, q1Emitter, q2Emitter }) => {
    const design = designFor('wilson', { pairEmitterResistanceOhm: degenerationOhm, collectorMismatch: 0.01 });
    const elements = parseNetlistElements(spiceNetlist(design, { analysis: 'op' }));
    const q1 = transistor(elements, 'Q1');
    const q2 = transistor(elements, 'Q2');
    expect([q1.collector, q1.base, q1.emitter]).toEqual(['c1', 'in1', q1Emitter]);
    expect([q2.collector, q2.base, q2.emitter]).toEqual(['c2', 'in2', q2Emitter]);
    expectResistor(elements, 'vp', 'c1', 6200);
    expectResistor(elements, 'vp', 'c2', 6200 * 1.01);
    if (degenerationOhm > 0) {
      expectResistor(elements, 'e1', 't', degenerationOhm);
      expectResistor(elements, 'e2', 't', degenerationOhm);
    }
  });

  test('supplies and inputs: VP on vp, VN on vn, inputs at the common-mode DC voltage', () => {
    const design = designFor('simple-mirror', { supply: { positiveV: 12, negativeV: 0 }, inputCommonModeV: 3.3 });
    const elements = parseNetlistElements(spiceNetlist(design, { analysis: 'op' }));
    expect(source(elements, 'VP')).toMatchObject({ nodes: ['vp', '0'], dcV: 12, acMagnitude: 0 });
    expect(source(elements, 'VN')).toMatchObject({ nodes: ['vn', '0'], dcV: 0, acMagnitude: 0 });
    expect(source(elements, 'VIN1')).toMatchObject({ nodes: ['in1', '0'], dcV: 3.3, acMagnitude: 0 });
    expect(source(elements, 'VIN2')).toMatchObject({ nodes: ['in2', '0'], dcV: 3.3, acMagnitude: 0 });
  });

  test('ac-differential: v(in1 − in2) = 1 split as 0.5 ∠0° and 0.5 ∠180°', () => {
    const elements = parseNetlistElements(spiceNetlist(designFor('wilson'), { analysis: 'ac-differential', ...AC_SWEEP }));
    expect(source(elements, 'VIN1')).toMatchObject({ dcV: 0.5, acMagnitude: 0.5, acPhaseDeg: 0 });
    expect(source(elements, 'VIN2')).toMatchObject({ dcV: 0.5, acMagnitude: 0.5, acPhaseDeg: 180 });
  });

  test('ac-common-mode: both inputs AC 1 ∠0°', () => {
    const elements = parseNetlistElements(spiceNetlist(designFor('wilson'), { analysis: 'ac-common-mode', ...AC_SWEEP }));
    expect(source(elements, 'VIN1')).toMatchObject({ dcV: 0.5, acMagnitude: 1, acPhaseDeg: 0 });
    expect(source(elements, 'VIN2')).toMatchObject({ dcV: 0.5, acMagnitude: 1, acPhaseDeg: 0 });
  });

  test.each(TOPOLOGIES)('%s, ac-tail: only the tail elements, t held by a source at tailNodeV with AC 1', (topology) => {
    const design = designFor(topology, { pairEmitterResistanceOhm: 100, tailCapacitanceF: 1e-11 });
    const elements = parseNetlistElements(spiceNetlist(design, { analysis: 'ac-tail', tailNodeV: -0.61, ...AC_SWEEP }));
    const tailNames = stageCircuit(design)
      .elements.filter((e) => e.part === 'tail')
      .map((e) => e.name);
    expect(elements.filter((e) => e.kind !== 'V').map((e) => e.name)).toEqual(tailNames);
    expect(source(elements, TAIL_TEST_SOURCE)).toMatchObject({ nodes: ['t', '0'], dcV: -0.61, acMagnitude: 1, acPhaseDeg: 0 });
    expect(elements.some((e) => e.name === 'VIN1' || e.name === 'VIN2')).toBe(false);
    CONTRACT_CONNECTIONS[topology](elements, design.tail);
  });

  test('model card: the effective IS (from vbeOnV when IS is absent), BF, VAF; VAF omitted when infinite', () => {
    const withEarly = modelParameters(spiceNetlist(designFor('resistor'), { analysis: 'op' }));
    expect(withEarly).toEqual({ IS: 1.1e-14, BF: 165, VAF: 92 });
    const fromVbe: DeviceParams = { family: 'npn', beta: 240, vbeOnV: 0.68, earlyVoltageV: 0 };
    const derived = modelParameters(spiceNetlist(designFor('resistor', { device: fromVbe }), { analysis: 'op' }));
    expect(derived).toEqual({ IS: nominalSaturationCurrentA(fromVbe), BF: 240 });
  });

  test.each([-40, 27, 85])('.temp %s and .options tnom=27, each on its own line (contract, version 2)', (temperatureC) => {
    const netlist = spiceNetlist(designFor('widlar', { temperatureC }), { analysis: 'op' });
    const lines = netlist.split('\n');
    expect(lines.filter((line) => /^\.options\s/i.test(line))).toEqual(['.options tnom=27']);
    expect(lines.filter((line) => /^\.temp\s/i.test(line))).toEqual([`.temp ${temperatureC}`]);
  });

  test('a tail with PNPs gets the PNP\'s card from device.pnp, as SPICE writes a PNP model; a design without PNPs none', () => {
    const cards = (topology: TopologyId) => spiceNetlist(designFor(topology), { analysis: 'op' }).split('\n').filter((line) => /^\.model\s/i.test(line));
    expect(cards('ptat')).toContain(`.model ${PNP_MODEL_NAME} PNP (IS=6e-15 BF=85 VAF=48)`);
    expect(cards('widlar').some((line) => /\bpnp\b/i.test(line))).toBe(false);
    const card = { IS: 9e-15, BF: 70, VAF: 35, CJS: 2e-12 };
    expect(cards('ptat').length).toBe(2);
    const withCard = spiceNetlist(designFor('ptat', { device: { ...NETLIST_DEVICE, pnp: { model: card } } }), { analysis: 'op' });
    expect(withCard).toContain(`.model ${PNP_MODEL_NAME} PNP (IS=9e-15 BF=70 VAF=35 CJS=2e-12)`);
  });

  test('a design with a model card writes every parameter the card gives, in the list\u2019s order, and nothing else', () => {
    const model = { CJE: 8e-12, IS: 3e-15, BF: 210, VAF: 0, IKF: 0.06, ISE: 4e-15, NE: 1.7, RB: 90, RE: 0.8, RC: 12, XTB: 1.4 };
    const parameters = modelParameters(spiceNetlist(designFor('resistor', { device: { family: 'npn', model } }), { analysis: 'op' }));
    expect(parameters).toEqual(model);
    const netlist = spiceNetlist(designFor('resistor', { device: { family: 'npn', model } }), { analysis: 'op' });
    expect(/\((.*)\)/.exec(netlist.split('\n').find((line) => line.startsWith('.model'))!)![1].split(' ').map((pair) => pair.split('=')[0])).toEqual(
      ['IS', 'BF', 'VAF', 'IKF', 'ISE', 'NE', 'RB', 'RE', 'RC', 'CJE', 'XTB'],
    );
  });

  test.each(TOPOLOGIES)('%s: every transistor has four terminals, its substrate at the negative rail', (topology) => {
    const design = designFor(topology, { supply: { positiveV: 9, negativeV: -6 } });
    const transistors = parseNetlistElements(spiceNetlist(design, { analysis: 'op' })).filter((e) => e.kind === 'Q');
    expect(transistors.length).toBeGreaterThan(1);
    for (const q of transistors) expect(q.kind === 'Q' && q.substrate, q.name).toBe('vn');
    expect(source(parseNetlistElements(spiceNetlist(design, { analysis: 'op' })), 'VN')).toMatchObject({ nodes: ['vn', '0'], dcV: -6 });
  });

  test('a solver RELTOL, when asked for, joins the same .options line', () => {
    const netlist = spiceNetlist(designFor('widlar'), { analysis: 'op', relativeTolerance: 1e-6 });
    expect(netlist.split('\n').filter((line) => /^\.options\s/i.test(line))).toEqual(['.options tnom=27 reltol=0.000001']);
    expect(() => spiceNetlist(designFor('widlar'), { analysis: 'op', relativeTolerance: 0 })).toThrow(RangeError);
  });

  test('transistor area factors are written only when ≠ 1', () => {
    const elements = parseNetlistElements(spiceNetlist(designFor('cascode', { pairSaturationCurrentMismatch: -0.015 }), { analysis: 'op' }));
    expect(transistor(elements, 'Q2').area).toBe(0.985);
    const netlist = spiceNetlist(designFor('cascode'), { analysis: 'op' });
    expect(netlist).not.toMatch(/area=/i);
  });

  test('header comments holding user text stay comment lines: the cards are the same as without them', () => {
    const hostile = ['spec "Kestrel\n.control\nshell id\n.endc"', 'QX\r.include /etc/passwd', 'a\u2028.lib x.lib\u000c*#shell id'];
    const withComments = spiceNetlist(designFor('wilson'), { analysis: 'op' }, hostile).split('\n');
    const without = spiceNetlist(designFor('wilson'), { analysis: 'op' }).split('\n');
    expect(withComments.filter((line) => !line.startsWith('* '))).toEqual(without.filter((line) => !line.startsWith('* ')));
    expect(withComments.filter((line) => /^\s*(\.control|\.include|\.lib|shell|\*#)/i.test(line))).toEqual([]);
    expect(withComments).toContain('* QX');
    expect(withComments).toContain('* .include /etc/passwd');
  });

  test('rejects an AC sweep that SPICE cannot run', () => {
    expect(() => spiceNetlist(designFor('resistor'), { analysis: 'ac-common-mode', startHz: 0, stopHz: 10, pointsPerDecade: 5 })).toThrow(RangeError);
    expect(() => spiceNetlist(designFor('resistor'), { analysis: 'ac-common-mode', startHz: 1, stopHz: 10, pointsPerDecade: 2.5 })).toThrow(RangeError);
  });
});

describe('spiceNetlist: every line and card', () => {
  test.each(TOPOLOGIES)('%s: every element is named with its SPICE letter (R, C, Q), the netlist writes the names as they are', (topology) => {
    const design = designFor(topology, { tailCapacitanceF: 1e-12, loadCapacitanceF: 2e-12, sourceResistanceOhm: 600, pairEmitterResistanceOhm: 100 });
    const letter = { resistor: 'R', capacitor: 'C', npn: 'Q', pnp: 'Q', nmos: 'M', pmos: 'M' } as const;
    const circuit = stageCircuit(design);
    for (const element of circuit.elements) expect(element.name, element.name).toMatch(new RegExp(`^${letter[element.kind]}`));
    const names = parseNetlistElements(spiceNetlist(design, { analysis: 'op' })).filter((e) => e.kind !== 'V').map((e) => e.name);
    expect(names.sort()).toEqual(circuit.elements.map((e) => e.name).sort());
  });

  test.each(ANALYSES.map((options) => [options.analysis, options] as const))('%s: no blank line; the title names the topology and the analysis; .end last', (_name, options) => {
    const lines = spiceNetlist(designFor('widlar', { tailCapacitanceF: 1e-12 }), options).split('\n');
    expect(lines[0]).toBe(`Longtail differential pair, widlar tail (${options.analysis})`);
    expect(lines.at(-1)).toBe('');
    expect(lines.at(-2)).toBe('.end');
    expect(lines.slice(0, -1).filter((line) => line.trim() === '')).toEqual([]);
  });

  test('ac-tail: the pair is left out, and a comment says so; the other analyses hold the pair', () => {
    const tailOnly = spiceNetlist(designFor('simple-mirror'), { analysis: 'ac-tail', tailNodeV: -0.7, ...AC_SWEEP }).split('\n');
    expect(tailOnly.filter((line) => /^\*.*left out/.test(line))).toHaveLength(1);
    expect(tailOnly.filter((line) => /^Q[12]\s/.test(line))).toEqual([]);
    const whole = spiceNetlist(designFor('simple-mirror'), { analysis: 'op' }).split('\n');
    expect(whole.filter((line) => /left out/.test(line))).toEqual([]);
    expect(whole.filter((line) => /^Q[12]\s/.test(line))).toHaveLength(2);
  });

  test('without header comments the netlist is the one with an empty list of them', () => {
    expect(spiceNetlist(designFor('wilson'), { analysis: 'op' })).toBe(spiceNetlist(designFor('wilson'), { analysis: 'op' }, []));
  });

  test('a pair transistor with its own BF or VAF uses its own card, QNPN_Q2, named the same on its Q line', () => {
    const netlist = spiceNetlist(designFor('resistor', { pairBetaMismatch: 0.05 }), { analysis: 'op' });
    const lines = netlist.split('\n');
    expect(lines.filter((line) => line.startsWith('.model ')).map((line) => line.split(' ')[1])).toEqual(['QNPN', 'QNPN_Q2']);
    expect(transistor(parseNetlistElements(netlist), 'Q2')).toMatchObject({ model: 'QNPN_Q2', substrate: 'vn' });
    expect(transistor(parseNetlistElements(netlist), 'Q1')).toMatchObject({ model: 'QNPN', substrate: 'vn' });
  });

  test('device figures: `.save all` then @name[vector] for every transistor of the stage, lower case, before .op; none asked, no .save line', () => {
    const lines = spiceNetlist(designFor('simple-mirror'), { analysis: 'op', transistorVectors: ['gm', 'ic'] }).split('\n');
    expect(lines.filter((line) => line.startsWith('.save'))).toEqual(['.save all @q1[gm] @q1[ic] @q2[gm] @q2[ic] @q3[gm] @q3[ic] @q4[gm] @q4[ic]']);
    expect(lines.indexOf('.op')).toBe(lines.findIndex((line) => line.startsWith('.save')) + 1);
    expect(spiceNetlist(designFor('simple-mirror'), { analysis: 'op', transistorVectors: [] })).not.toMatch(/\.save/);
    expect(spiceNetlist(designFor('simple-mirror'), { analysis: 'op' })).not.toMatch(/\.save/);
  });

  test.each([0, 1, 1.5, -1e-6])('a RELTOL of %d is refused (it must lie in (0, 1))', (relativeTolerance) => {
    expect(() => spiceNetlist(designFor('widlar'), { analysis: 'op', relativeTolerance })).toThrow(/relativeTolerance must be in \(0, 1\)/);
  });

  test.each([
    ['a start at 0 Hz', { startHz: 0, stopHz: 10, pointsPerDecade: 5 }],
    ['a stop below the start', { startHz: 100, stopHz: 10, pointsPerDecade: 5 }],
    ['no points per decade', { startHz: 1, stopHz: 10, pointsPerDecade: 0 }],
    ['a fractional count of points', { startHz: 1, stopHz: 10, pointsPerDecade: 2.5 }],
  ])('an AC sweep with %s is refused, naming what SPICE needs', (_name, sweep) => {
    expect(() => spiceNetlist(designFor('resistor'), { analysis: 'ac-common-mode', ...sweep })).toThrow(/AC sweep needs 0 < startHz <= stopHz and an integer pointsPerDecade >= 1/);
  });

  // The sources as SPICE3 reads them (the SPICE3 user's guide: V name n+ n- DC v AC mag phase,
  // E name n+ n- nc+ nc- gain, PULSE(v1 v2 td tr tf pw per)), and each analysis card's syntax
  test('an offset input: VIN1 and VIN2 at the common mode ± half of it, so v(in1) − v(in2) is the offset', () => {
    const netlist = spiceNetlist(designFor('resistor', { inputCommonModeV: 1 }), { analysis: 'op', differentialInputV: 0.004 });
    const sources = parseNetlistElements(netlist).filter((e): e is ParsedV => e.kind === 'V');
    expect(sources.find((v) => v.name === 'VIN1')).toMatchObject({ nodes: ['in1', '0'], dcV: 1.002 });
    expect(sources.find((v) => v.name === 'VIN2')).toMatchObject({ nodes: ['in2', '0'], dcV: 0.998 });
    expect(() => spiceNetlist(designFor('resistor'), { analysis: 'op', differentialInputV: Number.NaN })).toThrow(/differentialInputV must be a finite number/);
  });

  test.each(['dc-differential', 'noise', 'tran-step'] as const)('%s: one differential source VD split by EIN1 (+½) and EIN2 (−½) over VCM at the common mode onto the drive nodes', (analysis) => {
    const options = ANALYSES.find((o) => o.analysis === analysis)!;
    const lines = spiceNetlist(designFor('simple-mirror', { inputCommonModeV: 0.5, sourceResistanceOhm: 1000 }), options).split('\n');
    expect(lines).toContain('VCM vcm 0 DC 0.5');
    expect(lines).toContain('EIN1 drv1 vcm vd 0 0.5');
    expect(lines).toContain('EIN2 drv2 vcm vd 0 -0.5');
    expect(lines.filter((line) => line.startsWith('VD vd 0 '))).toHaveLength(1);
    expect(lines.filter((line) => /^VIN[12]\s/.test(line))).toEqual([]);
  });

  test('the analysis cards of the new analyses, as SPICE3 writes them', () => {
    const card = (options: NetlistOptions) => analysisCards(spiceNetlist(designFor('widlar'), options));
    expect(card({ analysis: 'dc-differential', startV: -0.1, stopV: 0.1, stepV: 0.001 })).toEqual(['.dc VD -0.1 0.1 0.001']);
    expect(card({ analysis: 'dc-differential', startV: 0, stopV: -2, stepV: -0.01 })).toEqual(['.dc VD 0 -2 -0.01']);
    expect(card({ analysis: 'noise', startHz: 10, stopHz: 100, pointsPerDecade: 1 })).toEqual(['.noise v(c1,c2) VD dec 1 10 100']);
    expect(card({ analysis: 'tran-step', fromV: -1, toV: 1, delayS: 1e-9, stepS: 1e-10, stopS: 1e-6 })).toEqual(['.tran 1e-10 0.000001 0 1e-10']);
    expect(card({ analysis: 'ac-rail', rail: 'positive', startHz: 1, stopHz: 10, pointsPerDecade: 1 })).toEqual(['.ac dec 1 1 10']);
  });

  test('noise: VD carries AC 1 (the gain ngspice refers the output noise through is from VD alone); tran-step: VD a single 1 ns edge from −1 V to +1 V held past the run', () => {
    const noise = spiceNetlist(designFor('resistor'), { analysis: 'noise', ...AC_SWEEP }).split('\n');
    expect(noise.find((line) => line.startsWith('VD '))).toBe('VD vd 0 DC 0 AC 1 0');
    const step = spiceNetlist(designFor('resistor'), { analysis: 'tran-step', fromV: -1, toV: 1, delayS: 2e-9, stepS: 1e-10, stopS: 1e-6 }).split('\n');
    expect(step.find((line) => line.startsWith('VD '))).toBe('VD vd 0 DC -1 PULSE(-1 1 2e-9 1e-9 1e-9 0.000002 0.000004)');
  });

  test('ac-rail: AC 1 on the chosen rail only; the inputs at DC', () => {
    for (const rail of ['positive', 'negative'] as const) {
      const sources = parseNetlistElements(spiceNetlist(designFor('cascode'), { analysis: 'ac-rail', rail, ...AC_SWEEP })).filter((e): e is ParsedV => e.kind === 'V');
      expect(sources.filter((v) => v.acMagnitude !== 0).map((v) => v.name)).toEqual([rail === 'positive' ? 'VP' : 'VN']);
    }
  });

  test.each([
    ['a zero step', { startV: 0, stopV: 1, stepV: 0 }],
    ['a step away from the stop', { startV: 0, stopV: 1, stepV: -0.1 }],
    ['an infinite stop', { startV: 0, stopV: Number.POSITIVE_INFINITY, stepV: 0.1 }],
  ])('a DC sweep with %s is refused', (_name, sweep) => {
    expect(() => spiceNetlist(designFor('resistor'), { analysis: 'dc-differential', ...sweep })).toThrow(/DC sweep needs/);
  });

  test('a transient whose stop is not past its step, or whose edge is not positive, is refused', () => {
    expect(() => spiceNetlist(designFor('resistor'), { analysis: 'tran-step', fromV: -1, toV: 1, delayS: 0, stepS: 1e-6, stopS: 1e-6 })).toThrow(/transient needs 0 < stepS < stopS/);
    expect(() => spiceNetlist(designFor('resistor'), { analysis: 'tran-step', fromV: -1, toV: 1, delayS: 0, stepS: 1e-9, stopS: 1e-6, edgeS: 0 })).toThrow(/step needs edgeS > 0/);
  });

  test('an AC sweep of one frequency is a sweep SPICE runs', () => {
    expect(analysisCards(spiceNetlist(designFor('resistor'), { analysis: 'ac-common-mode', startHz: 10, stopHz: 10, pointsPerDecade: 1 }))).toEqual(['.ac dec 1 10 10']);
  });
});

describe('parseNetlistElements', () => {
  test('comments, inline comments, continuation lines, suffixes and area forms', () => {
    const text = [
      'hand-written check netlist',
      '* a comment line',
      'R1 a b 4.7k ; inline comment',
      'Q7 c',
      '+ b e MOD 2',
      'Q8 c b e MOD area=0.5',
      'Q9 c b e vn MOD',
      'Q10 c b e sub MOD 3',
      'C1 t 0 22p',
      'V1 in 0 DC -1.5 AC 0.5 180',
      'V2 in2 0 2.5',
      '.model MOD NPN (IS=1e-15)',
      '.end',
    ].join('\n');
    expect(parseNetlistElements(text)).toEqual([
      { kind: 'R', name: 'R1', nodes: ['a', 'b'], valueOhm: 4700 },
      { kind: 'Q', name: 'Q7', collector: 'c', base: 'b', emitter: 'e', model: 'MOD', area: 2 },
      { kind: 'Q', name: 'Q8', collector: 'c', base: 'b', emitter: 'e', model: 'MOD', area: 0.5 },
      { kind: 'Q', name: 'Q9', collector: 'c', base: 'b', emitter: 'e', substrate: 'vn', model: 'MOD', area: 1 },
      { kind: 'Q', name: 'Q10', collector: 'c', base: 'b', emitter: 'e', substrate: 'sub', model: 'MOD', area: 3 },
      { kind: 'C', name: 'C1', nodes: ['t', '0'], valueF: 22e-12 },
      { kind: 'V', name: 'V1', nodes: ['in', '0'], dcV: -1.5, acMagnitude: 0.5, acPhaseDeg: 180 },
      { kind: 'V', name: 'V2', nodes: ['in2', '0'], dcV: 2.5, acMagnitude: 0, acPhaseDeg: 0 },
    ]);
  });
});

describe('parseNetlistElements: what SPICE3 reads as an element card', () => {
  test('the title is never an element, even when it reads like one; indented cards, runs of spaces and a trailing `*` are read', () => {
    const text = ['R1 a b 1k', '   R2   a    b   2.2k', 'R7 a b 3.3k *', '*R9 a b 1k', '.end'].join('\n');
    expect(parseNetlistElements(text)).toStrictEqual([
      { kind: 'R', name: 'R2', nodes: ['a', 'b'], valueOhm: 2200 },
      { kind: 'R', name: 'R7', nodes: ['a', 'b'], valueOhm: 3300 },
    ]);
  });

  test('transistors: three terminals without an area, a model name with digits, an inline comment, an OFF keyword, a word that is not area=', () => {
    const text = [
      'title',
      'Q11 c b e MOD',
      'Q12 c b e vn QNPN_Q2',
      'Q13 c b e MOD ; a note',
      'Q14 c b e MOD 2 off',
      'Q15 c b e vn MOD xarea=3',
    ].join('\n');
    expect(parseNetlistElements(text)).toStrictEqual([
      { kind: 'Q', name: 'Q11', collector: 'c', base: 'b', emitter: 'e', model: 'MOD', area: 1 },
      { kind: 'Q', name: 'Q12', collector: 'c', base: 'b', emitter: 'e', substrate: 'vn', model: 'QNPN_Q2', area: 1 },
      { kind: 'Q', name: 'Q13', collector: 'c', base: 'b', emitter: 'e', model: 'MOD', area: 1 },
      { kind: 'Q', name: 'Q14', collector: 'c', base: 'b', emitter: 'e', model: 'MOD', area: 2 },
      { kind: 'Q', name: 'Q15', collector: 'c', base: 'b', emitter: 'e', substrate: 'vn', model: 'MOD', area: 1 },
    ]);
  });

  test.each([
    ['AC with no DC value', 'V3 x 0 AC 1', { dcV: 0, acMagnitude: 1, acPhaseDeg: 0 }],
    ['AC magnitude and phase first', 'V6 x 0 AC 0.5 45', { dcV: 0, acMagnitude: 0.5, acPhaseDeg: 45 }],
    ['AC with no magnitude before DC', 'V4 x 0 AC DC 2', { dcV: 2, acMagnitude: 1, acPhaseDeg: 0 }],
    ['DC then AC with a phase', 'V5 x 0 DC 1 AC 0.5 90', { dcV: 1, acMagnitude: 0.5, acPhaseDeg: 90 }],
    ['a bare DC value, an inline comment', 'V7 x 0 -3 ; AC 1', { dcV: -3, acMagnitude: 0, acPhaseDeg: 0 }],
  ])('a voltage source: %s', (_name, line, expected) => {
    const [parsed] = parseNetlistElements(`title\n${line}`);
    expect(parsed).toStrictEqual({ kind: 'V', name: line.split(' ')[0], nodes: ['x', '0'], ...expected });
  });
});
