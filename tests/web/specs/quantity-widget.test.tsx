// @vitest-environment jsdom
import Form from '@rjsf/core';
import type { RJSFSchema } from '@rjsf/utils';
import { customizeValidator } from '@rjsf/validator-ajv8';
import { cleanup, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, test, vi } from 'vitest';
import { FORM_TEMPLATES, FORM_WIDGETS } from '../../../web/src/components/forms/form-theme';
import { quantityText, readQuantity } from '../../../web/src/components/forms/quantity-text';
import { mockFetch } from './fetch-mock';

const validator = customizeValidator({ ajvOptionsOverrides: { keywords: ['x-unit'] } });

function renderQuantity(unit: string, initial?: number) {
  const schema = { type: 'object', properties: { x: { type: 'number', title: 'Load resistor', 'x-unit': unit } } } as RJSFSchema;
  const onChange = vi.fn();
  render(
    <Form
      schema={schema}
      uiSchema={{ x: { 'ui:widget': 'quantity' } }}
      formData={initial === undefined ? {} : { x: initial }}
      validator={validator}
      templates={FORM_TEMPLATES}
      widgets={FORM_WIDGETS}
      onChange={onChange}
    />,
  );
  const lastValue = () => (onChange.mock.calls.at(-1)?.[0] as { formData: { x?: number } }).formData.x;
  return { input: screen.getByLabelText('Load resistor'), lastValue };
}

let network: ReturnType<typeof mockFetch>;
beforeEach(() => {
  network = mockFetch({});
});
afterEach(() => {
  cleanup();
  network.assertNoUnexpectedRequests();
  vi.unstubAllGlobals();
});

describe('QuantityWidget', () => {
  test('when "4k7" is typed in an ohm field, then it shows "= 4.7 kΩ" and yields 4700', async () => {
    const { input, lastValue } = renderQuantity('Ω');
    await userEvent.type(input, '4k7');
    expect(screen.getByText('= 4.7 kΩ')).toBeTruthy();
    expect(lastValue()).toBe(4700);
    expect((input as HTMLInputElement).value).toBe('4k7');
    expect(input.getAttribute('aria-describedby')).toContain('__reading');
  });

  test('when garbage is typed, then it says inline it cannot read it, and the value is empty', async () => {
    const { input, lastValue } = renderQuantity('V');
    await userEvent.type(input, '12 volts please');
    expect(screen.getByText(/cannot read '12 volts please' as a quantity in V/)).toBeTruthy();
    expect(input.getAttribute('aria-invalid')).toBe('true');
    expect(lastValue()).toBeUndefined();
    expect((input as HTMLInputElement).value).toBe('12 volts please');
  });

  test('when the field starts with a stored value, then it shows it in short engineering text', () => {
    const { input } = renderQuantity('A', 1e-5);
    expect((input as HTMLInputElement).value).toBe('10µ');
    expect(screen.getByText('= 10 µA')).toBeTruthy();
  });
});

describe('readQuantity', () => {
  test.each([
    ['4k7', 'Ω', 4700],
    ['4.7k', 'Ω', 4700],
    ['10u', 'A', 1e-5],
    ['2 pF', 'F', 2e-12],
    ['-12 V', 'V', -12],
    ['\u221212', 'V', -12],
    ['1M', 'Hz', 1e6],
    ['1m', 'V', 1e-3],
    ['80', 'dB', 80],
  ])('"%s" in %s reads as %d', (text, unit, expected) => {
    const reading = readQuantity(text, unit);
    expect(reading.kind).toBe('value');
    if (reading.kind === 'value') expect(Math.abs(reading.value - expected)).toBeLessThanOrEqual(Math.abs(expected) * 1e-12);
  });

  test.each([
    ['4,7k', 'Ω', /decimal separator/],
    ['12 A', 'V', /unexpected unit/],
    ['3k', 'dB', /takes no prefix/],
    ['abc', 'V', /try 4.7k/],
  ])('"%s" in %s cannot be read (%s)', (text, unit, why) => {
    const reading = readQuantity(text, unit);
    expect(reading.kind).toBe('unreadable');
    if (reading.kind === 'unreadable') expect(reading.message).toMatch(why);
  });

  test('empty text is empty, not an error', () => {
    expect(readQuantity('  ', 'V')).toEqual({ kind: 'empty' });
  });
});

describe('quantityText', () => {
  test.each([
    [0.65, 'V', '0.65'],
    [-12, 'V', '-12'],
    [4700, 'Ω', '4.7k'],
    [1e-5, 'A', '10µ'],
    [2e-12, 'F', '2p'],
    [1e6, 'Hz', '1M'],
    [0, 'F', '0'],
    [10000, 'V/V', '10000'],
  ])('%d %s is written "%s" and reads back the same', (value, unit, text) => {
    expect(quantityText(value, unit)).toBe(text);
    const back = readQuantity(text, unit);
    expect(back.kind === 'value' && Math.abs(back.value - value) <= Math.abs(value) * 1e-12).toBe(true);
  });
});
