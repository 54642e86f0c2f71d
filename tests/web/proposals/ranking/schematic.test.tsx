// @vitest-environment jsdom
import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, test } from 'vitest';
import type { Design, TopologyId } from '#shared/engine/types';
import { OptionSchematic } from '../../../../web/src/features/proposals/components/ranking/schematic/option-schematic';
import { strainBridge, studioLine } from './fixtures';

afterEach(cleanup);

const designs = new Map(strainBridge().options.map((o) => [o.topology, o.design!]));

function drawn(design: Design) {
  const { container } = render(<OptionSchematic design={design} />);
  const devices = [...container.querySelectorAll('[data-device]')].map((g) => g.getAttribute('data-device')).sort();
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

  test('a single supply says its negative rail is ground', () => {
    const design = { ...designs.get('resistor')!, supply: { positiveV: 12, negativeV: 0 } };
    const { container } = drawn(design);
    expect(container.textContent).toContain('0 V (ground)');
  });
});

describe('OptionSchematic colours', () => {
  /** The colour an element draws in: its own stroke or fill, or currentColor from its group. */
  const paints = (el: Element) => [el.getAttribute('stroke'), el.getAttribute('fill')].filter((p) => p !== null && p !== 'none');

  test.each<TopologyId>(['resistor', 'simple-mirror', 'degenerated-mirror', 'widlar', 'wilson', 'cascode'])('%s: the whole tail is drawn in the accent group and only there, every stroke in currentColor', (topology) => {
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
