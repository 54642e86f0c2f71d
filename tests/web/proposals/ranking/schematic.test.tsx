// @vitest-environment jsdom
import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, test } from 'vitest';
import type { Design, TopologyId } from '../../../../shared/engine/types';
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
    const { container } = drawn(designs.get('degenerated-mirror')!);
    const labels = [...container.querySelectorAll('text')].map((t) => t.textContent);
    expect(labels).toEqual(expect.arrayContaining(['RREF', '13.7 kΩ', 'RE3', 'RE4', '1.05 kΩ', 'RC1', '2.32 kΩ', 'in1', 'in2', 't']));
  });

  test('pair emitter resistors appear when the design has them', () => {
    const cascode = studioLine().options.find((o) => o.topology === 'cascode')!.design!;
    expect(drawn(cascode).parts).toEqual(['RC1', 'RC2', 'RE1', 'RE2', 'RREF']);
  });

  test('it is an image with a description of the circuit and its values', () => {
    render(<OptionSchematic design={designs.get('cascode')!} />);
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
