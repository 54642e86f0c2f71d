/**
 * What a change of the spec form means for the recorded library card (device-choice.ts).
 * Cards are invented.
 */
import { describe, expect, test } from 'vitest';
import type { LibraryDevice } from '../../../web/src/lib/device-library';
import { libraryDeviceFor, withDeviceChoice, withoutEmptyCard } from '../../../web/src/features/specs/lib/device-choice';

const N150 = {
  id: 1,
  name: 'FH-N150',
  checksum: 'a'.repeat(64),
  device: { family: 'npn', beta: 150, saturationCurrentA: 1.2e-15, earlyVoltageV: 86, model: { IS: 1.2e-15, BF: 150, VAF: 86, CJE: 18e-12, RB: 25 } },
} as LibraryDevice;
const LIBRARY = [N150];
const REF = { name: 'FH-N150', checksum: 'a'.repeat(64) };

describe('withDeviceChoice', () => {
  test('when a card is chosen, then its IS, BF, VAF and whole model replace the device values and the other device fields stay', () => {
    const previous = { device: { beta: 100, vceSatV: 0.3 } };
    const next = { device: { beta: 100, vceSatV: 0.3 }, deviceModel: REF };
    expect(withDeviceChoice(previous, next, LIBRARY)).toEqual({
      device: { beta: 150, saturationCurrentA: 1.2e-15, earlyVoltageV: 86, vceSatV: 0.3, model: { IS: 1.2e-15, BF: 150, VAF: 86, CJE: 18e-12, RB: 25 } },
      deviceModel: REF,
    });
  });

  test('when the chosen card is not in the loaded library, then nothing is filled', () => {
    const next = { device: { beta: 100 }, deviceModel: { name: 'FH-GONE', checksum: 'b'.repeat(64) } };
    expect(withDeviceChoice({ device: { beta: 100 } }, next, LIBRARY)).toBe(next);
  });

  test("when VAF changes under a kept choice, then the choice and the card's model are dropped and the typed value kept", () => {
    const model = { IS: 1.2e-15, BF: 150, VAF: 86, CJE: 18e-12, RB: 25 };
    const previous = { device: { beta: 150, saturationCurrentA: 1.2e-15, earlyVoltageV: 86, model }, deviceModel: REF };
    const next = { device: { beta: 150, saturationCurrentA: 1.2e-15, earlyVoltageV: 90, model }, deviceModel: REF };
    expect(withDeviceChoice(previous, next, LIBRARY)).toEqual({ device: { beta: 150, saturationCurrentA: 1.2e-15, earlyVoltageV: 90 } });
  });

  test('when another field changes under a kept choice, then the choice stays', () => {
    const previous = { title: 'a', device: { beta: 150, vceSatV: 0.2 }, deviceModel: REF };
    const next = { title: 'b', device: { beta: 150, vceSatV: 0.25 }, deviceModel: REF };
    expect(withDeviceChoice(previous, next, LIBRARY)).toBe(next);
  });
});

describe('libraryDeviceFor', () => {
  test('when the name differs only in case and the checksum matches, then it is the same card (SPICE names ignore case)', () => {
    expect(libraryDeviceFor({ name: 'fh-n150', checksum: 'a'.repeat(64) }, LIBRARY)).toBe(N150);
  });

  test('when the checksum differs, then it is another upload and not this card', () => {
    expect(libraryDeviceFor({ name: 'FH-N150', checksum: 'b'.repeat(64) }, LIBRARY)).toBeUndefined();
  });
});

describe('withoutEmptyCard', () => {
  test('when the form hands back an empty deviceModel and a model of undefined values, then both are dropped and the rest kept', () => {
    const draft = { title: 'a', deviceModel: {}, device: { beta: 100, model: { IS: undefined, CJE: undefined } } };
    expect(withoutEmptyCard(draft)).toEqual({ title: 'a', device: { beta: 100 } });
  });

  test('when a card is recorded and its model filled, then nothing changes', () => {
    const draft = { deviceModel: REF, device: { beta: 150, model: { BF: 150 } } };
    expect(withoutEmptyCard(draft)).toBe(draft);
  });

  test('when the PNP section was emptied again (its values and its model undefined), then there is no PNP', () => {
    const draft = { title: 'a', device: { beta: 100, pnp: { beta: undefined, earlyVoltageV: undefined, model: { BF: undefined } } } };
    expect(withoutEmptyCard(draft)).toEqual({ title: 'a', device: { beta: 100 } });
  });

  test('when the PNP has a value and an empty model, then the model goes and the value stays', () => {
    const draft = { device: { beta: 100, pnp: { beta: 110, model: {} } } };
    expect(withoutEmptyCard(draft)).toEqual({ device: { beta: 100, pnp: { beta: 110 } } });
  });

  test('when the PNP is given, then nothing changes', () => {
    const draft = { device: { beta: 100, pnp: { beta: 110, earlyVoltageV: 46 } } };
    expect(withoutEmptyCard(draft)).toBe(draft);
  });
});
