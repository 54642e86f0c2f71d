/**
 * Reading ngspice's binary raw file (the format ngspice's `-r` writes: a text header up to
 * `Binary:`, then per point one little-endian double per variable, two for a complex plot), on
 * files built here by hand with known numbers.
 */
import { describe, expect, test } from 'vitest';
import { readRawFile } from '../../helpers/debian-ngspice';

function rawFile(headerLines: string[], doubles: number[]): Buffer {
  const body = Buffer.alloc(doubles.length * 8);
  doubles.forEach((x, i) => body.writeDoubleLE(x, i * 8));
  return Buffer.concat([Buffer.from(`${headerLines.join('\n')}\nBinary:\n`, 'latin1'), body]);
}

describe('an ngspice binary raw file', () => {
  test('a real plot: one point, values by variable in order', () => {
    const raw = rawFile(
      ['Title: divider', 'Date: today', 'Plotname: Operating Point', 'Flags: real', 'No. Variables: 3', 'No. Points: 1       ', 'Variables:', '\t0\tv(in)\tvoltage', '\t1\tv(out)\tvoltage', '\t2\ti(vin)\tcurrent'],
      [3, 2, -1e-3],
    );
    const result = readRawFile(raw);
    expect(result.dataType).toBe('real');
    expect(result.numPoints).toBe(1);
    expect(/^Plotname: (.*)$/m.exec(result.header)?.[1]).toBe('Operating Point');
    expect(result.data.map((d) => [d.name, d.type, d.values])).toEqual([
      ['v(in)', 'voltage', [3]],
      ['v(out)', 'voltage', [2]],
      ['i(vin)', 'current', [-1e-3]],
    ]);
  });

  test('a complex plot: two points, each variable a real and an imaginary double, the scale first', () => {
    const raw = rawFile(
      ['Title: rc', 'Date: today', 'Plotname: AC Analysis', 'Flags: complex', 'No. Variables: 2', 'No. Points: 2', 'Variables:', '\t0\tfrequency\tfrequency\tgrid=3', '\t1\tv(out)\tvoltage'],
      // point 0: f = 100 Hz, v = 0.5 − 0.5j; point 1: f = 1000 Hz, v = 0.1 − 0.3j
      [100, 0, 0.5, -0.5, 1000, 0, 0.1, -0.3],
    );
    const result = readRawFile(raw);
    expect(result.dataType).toBe('complex');
    expect(result.variableNames).toEqual(['frequency', 'v(out)']);
    expect(result.data[0].values).toEqual([{ real: 100, img: 0 }, { real: 1000, img: 0 }]);
    expect(result.data[1].values).toEqual([{ real: 0.5, img: -0.5 }, { real: 0.1, img: -0.3 }]);
  });

  test('a file that is not a binary raw file, or is cut short, is refused', () => {
    expect(() => readRawFile(Buffer.from('Title: x\nFlags: real\nValues:\n 0 1\n'))).toThrow(/Binary/);
    const short = rawFile(['Plotname: Operating Point', 'Flags: real', 'No. Variables: 2', 'No. Points: 1', 'Variables:', '\t0\tv(a)\tvoltage', '\t1\tv(b)\tvoltage'], [1]);
    expect(() => readRawFile(short)).toThrow(/short/);
  });
});
