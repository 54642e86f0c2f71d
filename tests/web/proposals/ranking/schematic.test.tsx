// @vitest-environment jsdom
import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, test } from 'vitest';
import type { Design, TopologyId } from '#shared/engine/types';
import { OptionSchematic } from '../../../../web/src/features/proposals/components/ranking/schematic/option-schematic';
import { geophoneNode, pressureProbe, strainBridge, studioLine } from './fixtures';

afterEach(cleanup);

const designs = new Map([...strainBridge().options, ...geophoneNode().options.filter((o) => o.topology === 'ptat')].map((o) => [o.topology, o.design!]));

function drawn(design: Design) {
  const { container } = render(<OptionSchematic design={design} />);
  const devices = [...container.querySelectorAll('[data-device]')].map((g) => g.getAttribute('data-device') ?? '').sort();
  const parts = [...container.querySelectorAll('[data-part^="R"]')].map((g) => g.getAttribute('data-part')).sort();
  return { container, devices, parts };
}

describe('OptionSchematic', () => {
  test.each<[TopologyId, string[], string[]]>([
    ['resistor', ['Q1', 'Q2'], ['RC1', 'RC2', 'RT']],
    ['simple-mirror', ['Q1', 'Q2', 'Q3', 'Q4'], ['RC1', 'RC2', 'RREF']],
    ['degenerated-mirror', ['Q1', 'Q2', 'Q3', 'Q4'], ['RC1', 'RC2', 'RE3', 'RE4', 'RREF']],
    ['widlar', ['Q1', 'Q2', 'Q3', 'Q4'], ['RC1', 'RC2', 'RE4', 'RREF']],
    ['wilson', ['Q1', 'Q2', 'Q3', 'Q4', 'Q5'], ['RC1', 'RC2', 'RREF']],
    ['cascode', ['Q1', 'Q2', 'Q3', 'Q4', 'Q5', 'Q6'], ['RC1', 'RC2', 'RREF']],
    ['ptat', ['Q1', 'Q2', 'Q3', 'Q4', 'Q7', 'Q8', 'Q9'], ['RC1', 'RC2', 'RE4', 'RSU']],
  ])('%s draws transistors %j and resistors %j', (topology, devices, parts) => {
    const result = drawn(designs.get(topology)!);
    expect(result.devices).toEqual(devices);
    expect(result.parts).toEqual(parts);
  });

  test('the Wilson tail has its node x', () => {
    const { container } = drawn(designs.get('wilson')!);
    expect([...container.querySelectorAll('text')].map((t) => t.textContent)).toContain('x');
  });

  test('resistor values are labelled from the design in engineering notation', () => {
    // Hand-set values on the engine's sized design, so the labels are known text.
    const design: Design = { ...designs.get('degenerated-mirror')!, collectorResistanceOhm: 2320, tail: { topology: 'degenerated-mirror', referenceResistanceOhm: 13_700, emitterResistanceOhm: 1050 } };
    const { container } = drawn(design);
    const labels = [...container.querySelectorAll('text')].map((t) => t.textContent);
    expect(labels).toEqual(expect.arrayContaining(['RREF', '13.7 kΩ', 'RE3', 'RE4', '1.05 kΩ', 'RC1', '2.32 kΩ', 'in1', 'in2', 't']));
  });

  test('pair emitter resistors appear when the design has them', () => {
    const cascode = studioLine().options.find((o) => o.topology === 'cascode')!.design!;
    expect(drawn(cascode).parts).toEqual(['RC1', 'RC2', 'RE1', 'RE2', 'RREF']);
  });

  test('it is an image with a description of the circuit and its values', () => {
    const design: Design = { ...designs.get('cascode')!, collectorResistanceOhm: 2320, supply: { positiveV: 7.5, negativeV: -7.5 }, tail: { topology: 'cascode', referenceResistanceOhm: 14_000 } };
    render(<OptionSchematic design={design} />);
    const image = screen.getByRole('img');
    const words = image.getAttribute('aria-label')!;
    expect(words).toContain('Emitter-coupled pair Q1 and Q2');
    expect(words).toContain('RC1 and RC2 2.32 kΩ to V+ (7.5 V)');
    expect(words).toContain('Q6 on Q4 with its base tied to Q5');
    expect(words).toContain('RREF 14 kΩ');
    expect(words).toContain('V− is −7.5 V');
  });

  test('the PTAT tail labels its area ratios as plain ratios under Q4 and Q9, and its resistors in ohms', () => {
    // Hand-set values on the engine's sized design, so the labels are known text; the output ratio left out is 1 (ENGINE-CONTRACT.md)
    const design: Design = { ...designs.get('ptat')!, tail: { topology: 'ptat', emitterResistanceOhm: 348, startupResistanceOhm: 2_740_000, areaRatio: 8 } };
    const { container } = drawn(design);
    const labelsOf = (name: string) => [...container.querySelectorAll(`[data-device="${name}"] text`)].map((t) => t.textContent);
    expect(labelsOf('Q4')).toEqual(['Q4', '8×']);
    expect(labelsOf('Q9')).toEqual(['Q9', '1×']);
    expect(labelsOf('Q3')).toEqual(['Q3']);
    const labels = [...container.querySelectorAll('text')].map((t) => t.textContent);
    expect(labels).toEqual(expect.arrayContaining(['RE4', '348 Ω', 'RSU', '2.74 MΩ']));
    expect(labels).not.toContain('8 Ω');
    expect(labels).not.toContain('1 Ω');
    const words = screen.getByRole('img').getAttribute('aria-label')!;
    expect(words).toMatch(/^Schematic, PTAT \(constant-gm\) source tail\./);
    expect(words).toContain("Q4 (8× Q3's area)");
    expect(words).toContain('RE4 348 Ω');
    expect(words).toContain('RSU 2.74 MΩ');
    expect(words).toContain('Q9 (1× area)');
  });

  test('a PTAT tail with another output ratio labels Q9 with it', () => {
    const design: Design = { ...designs.get('ptat')!, tail: { topology: 'ptat', emitterResistanceOhm: 348, startupResistanceOhm: 2_740_000, areaRatio: 24, outputAreaRatio: 2.5 } };
    const { container } = drawn(design);
    expect([...container.querySelectorAll('[data-device="Q9"] text')].map((t) => t.textContent)).toEqual(['Q9', '2.5×']);
    expect([...container.querySelectorAll('[data-device="Q4"] text')].map((t) => t.textContent)).toEqual(['Q4', '24×']);
  });

  test('the PTAT tail’s mirror is drawn as PNPs: the emitter arrow points into the bar, as the NPNs’ points out of it', () => {
    // IEEE 315 / IEC 60617: the arrow sits on the emitter, pointing out of the base for an NPN and into it for a PNP
    const { container } = drawn(designs.get('ptat')!);
    const arrow = (name: string) => {
      const device = container.querySelector(`[data-device="${name}"]`)!;
      const bar = device.querySelector('line')!;
      const barX = Number(bar.getAttribute('x1'));
      const [tip, ...back] = device.querySelector('polygon')!.getAttribute('points')!.split(' ').map((p) => p.split(',').map(Number));
      const backX = (back[0][0] + back[1][0]) / 2;
      return Math.abs(tip[0] - barX) < Math.abs(backX - barX) ? 'into the bar' : 'out of the bar';
    };
    expect(['Q7', 'Q8'].map(arrow)).toEqual(['into the bar', 'into the bar']);
    expect(['Q1', 'Q2', 'Q3', 'Q4', 'Q9'].map(arrow)).toEqual(Array(5).fill('out of the bar'));
    const pnps = [...container.querySelectorAll('[data-polarity="pnp"]')].map((g) => g.getAttribute('data-device'));
    expect(pnps.sort()).toEqual(['Q7', 'Q8']);
  });

  test('a single supply says its negative rail is ground', () => {
    const design = { ...designs.get('resistor')!, supply: { positiveV: 12, negativeV: 0 } };
    const { container } = drawn(design);
    expect(container.textContent).toContain('0 V (ground)');
  });
});

/** The PNP stage's designs (a PNP pair on 5 V and 0 V), one per tail it ranks: every bipolar tail but the PTAT source. */
const pnpDesigns = new Map(pressureProbe().options.map((o) => [o.topology, o.design!]));
const PNP_TAILS: [TopologyId, string[]][] = [
  ['resistor', ['RT']],
  ['simple-mirror', ['RREF']],
  ['degenerated-mirror', ['RE3', 'RE4', 'RREF']],
  ['widlar', ['RE4', 'RREF']],
  ['wilson', ['RREF']],
  ['cascode', ['RREF']],
];

/** Heights in the drawing (SVG y grows downwards): a part's middle, the rails, the tail node. */
function heights(container: Element) {
  const railY = (name: string) => Number(container.querySelector(`[data-part="${name}"] line`)!.getAttribute('y1'));
  const barMiddle = (name: string) => {
    const bar = container.querySelector(`[data-device="${name}"] line`)!;
    return (Number(bar.getAttribute('y1')) + Number(bar.getAttribute('y2'))) / 2;
  };
  const bodyMiddle = (name: string) => {
    const body = container.querySelector(`[data-part="${name}"] rect`)!;
    return Number(body.getAttribute('y')) + Number(body.getAttribute('height')) / 2;
  };
  /** Every height a part's wires reach. */
  const wireEnds = (name: string) => [...container.querySelectorAll(`[data-part="${name}"] polyline`)].flatMap((l) => l.getAttribute('points')!.split(' ').map((p) => Number(p.split(',')[1])));
  const tLabel = [...container.querySelectorAll('text')].find((t) => t.textContent === 't')!;
  return { positive: railY('V+'), negative: railY('V−'), barMiddle, bodyMiddle, wireEnds, tailLabel: Number(tLabel.getAttribute('y')) };
}

describe('OptionSchematic of a PNP stage', () => {
  test.each(PNP_TAILS)('%s: every transistor is a PNP, the pair hangs under the tail from V+ and its loads go down to V−', (topology, tailResistors) => {
    const design = pnpDesigns.get(topology)!;
    expect(design.device.family).toBe('pnp');
    const { container, devices, parts } = drawn(design);
    // The same parts as the NPN stage of that tail
    const npn = drawn(designs.get(topology)!);
    expect(devices).toEqual(npn.devices);
    expect(parts).toEqual(['RC1', 'RC2', ...(design.pairEmitterResistanceOhm ? ['RE1', 'RE2'] : []), ...tailResistors].sort());
    expect([...container.querySelectorAll('[data-device]')].map((d) => d.getAttribute('data-polarity'))).toEqual(Array(devices.length).fill('pnp'));
    const h = heights(container);
    // Top to bottom: V+, the tail's transistors, t, the pair, the loads, V−
    for (const name of devices.filter((d) => d !== 'Q1' && d !== 'Q2')) {
      expect(h.barMiddle(name)).toBeGreaterThan(h.positive);
      expect(h.barMiddle(name)).toBeLessThan(h.tailLabel);
    }
    for (const name of ['Q1', 'Q2']) {
      expect(h.barMiddle(name)).toBeGreaterThan(h.tailLabel);
      expect(h.bodyMiddle(`RC${name[1]}`)).toBeGreaterThan(h.barMiddle(name));
      expect(h.wireEnds(`RC${name[1]}`)).toContain(h.negative);
    }
    // The tail returns to V+; a mirror's reference resistor runs down to V−
    if (topology === 'resistor') expect(h.wireEnds('RT')).toContain(h.positive);
    else expect(h.wireEnds('RREF')).toContain(h.negative);
    npn.container.remove();
  });

  test('the NPN stage of the same tail stays the other way up: its pair above t, its loads from V+', () => {
    const { container } = drawn(designs.get('simple-mirror')!);
    const h = heights(container);
    expect(h.barMiddle('Q1')).toBeLessThan(h.tailLabel);
    expect(h.barMiddle('Q3')).toBeGreaterThan(h.tailLabel);
    expect(h.wireEnds('RC1')).toContain(h.positive);
    expect([...container.querySelectorAll('[data-device]')].every((d) => d.getAttribute('data-polarity') === 'npn')).toBe(true);
  });

  test('every emitter arrow of a PNP stage points into the bar (IEEE 315 / IEC 60617: a PNP’s arrow points into the base)', () => {
    const { container, devices } = drawn(pnpDesigns.get('cascode')!);
    for (const name of devices) {
      const device = container.querySelector(`[data-device="${name}"]`)!;
      const barX = Number(device.querySelector('line')!.getAttribute('x1'));
      const [tip, ...back] = device.querySelector('polygon')!.getAttribute('points')!.split(' ').map((p) => p.split(',').map(Number));
      expect(Math.abs(tip[0] - barX)).toBeLessThan(Math.abs((back[0][0] + back[1][0]) / 2 - barX));
    }
  });

  test('its labels stay upright: a resistor’s name above its value, each within its own body’s height', () => {
    const { container } = drawn(pnpDesigns.get('widlar')!);
    for (const name of ['RC1', 'RREF', 'RE4']) {
      const [label, value] = [...container.querySelectorAll(`[data-part="${name}"] text`)].map((t) => Number(t.getAttribute('y')));
      expect(label).toBeLessThan(value);
      const body = container.querySelector(`[data-part="${name}"] rect`)!;
      const top = Number(body.getAttribute('y'));
      expect(label).toBeGreaterThan(top);
      expect(value).toBeLessThan(top + Number(body.getAttribute('height')) + 4);
    }
  });

  test('its description names the PNP stage, the tail from V+ and the loads down to V−, with the mirror’s reference resistor to V−', () => {
    const design: Design = { ...pnpDesigns.get('cascode')!, collectorResistanceOhm: 1210, supply: { positiveV: 5, negativeV: 0 }, tail: { topology: 'cascode', referenceResistanceOhm: 8870 } };
    render(<OptionSchematic design={design} />);
    const words = screen.getByRole('img').getAttribute('aria-label')!;
    expect(words).toMatch(/^Schematic, cascode mirror tail, PNP stage \(every transistor a PNP/i);
    expect(words).toContain('Tail from V+ (5 V) at the top');
    expect(words).toContain('fed from V− through RREF 8.87 kΩ');
    expect(words).toContain('mirror Q3 (diode-connected) and Q4 at the top, emitters at V+');
    expect(words).toContain('RC1 and RC2 1.21 kΩ down to V− (0 V)');
    expect(words).not.toContain('to V+ (5 V)');
  });
});

describe('OptionSchematic colours', () => {
  /** The colour an element draws in: its own stroke or fill, or currentColor from its group. */
  const paints = (el: Element) => [el.getAttribute('stroke'), el.getAttribute('fill')].filter((p) => p !== null && p !== 'none');

  test.each<TopologyId>(['resistor', 'simple-mirror', 'degenerated-mirror', 'widlar', 'wilson', 'cascode', 'ptat'])('%s: the whole tail is drawn in the accent group and only there, every stroke in currentColor', (topology) => {
    const { container } = render(<OptionSchematic design={designs.get(topology)!} />);
    const accent = container.querySelector('g[data-accent="tail"]')!;
    expect(accent.getAttribute('class')).toMatch(/\btext-fern\b/);
    expect(accent.getAttribute('class')).toMatch(/\bschematic-tail\b/);
    const tails = container.querySelectorAll('[data-part="tail"]');
    expect(tails).toHaveLength(1);
    expect(accent.contains(tails[0])).toBe(true);
    // The tail's transistors beyond the pair (Q3…) are all inside it; the pair's are not.
    const tailDevices = [...accent.querySelectorAll('[data-device]')].map((d) => d.getAttribute('data-device'));
    expect(tailDevices).not.toContain('Q1');
    expect(tailDevices).not.toContain('Q2');
    expect(container.querySelectorAll('[data-device]').length - tailDevices.length).toBe(2);
    // No part of the tail sets a colour of its own: the group's accent is what shows.
    for (const el of accent.querySelectorAll('*')) for (const paint of paints(el)) expect(paint).toBe('currentColor');
  });
});
