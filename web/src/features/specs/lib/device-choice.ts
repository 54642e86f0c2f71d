/**
 * The spec form's device picker as data: which library card a spec's `deviceModel` names, and
 * what a change of the form means for it. Choosing a card fills `device` with the card's IS, BF
 * and VAF and its `model` (every Gummel-Poon parameter of the card; the rest of `device` is
 * kept); editing one of IS, BF or VAF afterwards drops `deviceModel` and `model`, since the card
 * no longer describes the values.
 */
import type { LibraryDevice, RecordedDeviceModel } from '../../../lib/device-library';

/** What the spec records of a library card (spec schema `deviceModel`). */
export interface DeviceModelRef {
  name: string;
  checksum: string;
}

/** The project's device library as the form sees it (hooks/use-device-library.ts). */
export interface DeviceLibraryState {
  /** The library's cards offered: the first page matching `filter` (and the recorded card when it is in the library). */
  items: readonly LibraryDevice[] | undefined;
  /** How many library cards match `filter` in all. */
  total: number;
  loading: boolean;
  error: unknown;
  /** Part of a name: the picker offers the cards whose name contains it. */
  filter: string;
  setFilter: (filter: string) => void;
  /** What the spec's recorded card resolves to; 'loading' while asked; null when the spec records none. */
  recorded: RecordedDeviceModel | 'loading' | null;
}

/** What the device picker field reads from the form context. */
export interface DeviceChoiceContext {
  deviceLibrary?: DeviceLibraryState;
}

type Draft = Record<string, unknown>;

/** The card fields of `device` a library card fills. */
const CARD_FIELDS = ['beta', 'saturationCurrentA', 'earlyVoltageV'] as const;

/** The `deviceModel` a form value records, if it is one. */
export function refOf(value: unknown): DeviceModelRef | undefined {
  if (!value || typeof value !== 'object') return undefined;
  const { name, checksum } = value as Partial<DeviceModelRef>;
  return typeof name === 'string' && typeof checksum === 'string' ? { name, checksum } : undefined;
}

const sameRef = (a: DeviceModelRef | undefined, b: DeviceModelRef | undefined) =>
  a !== undefined && b !== undefined && a.name.toLowerCase() === b.name.toLowerCase() && a.checksum === b.checksum;

/** The library card a reference names (same name, case-insensitive, from the same file). */
export function libraryDeviceFor(reference: unknown, library: readonly LibraryDevice[] | undefined): LibraryDevice | undefined {
  const ref = refOf(reference);
  return ref ? library?.find((device) => sameRef(ref, { name: device.name, checksum: device.checksum })) : undefined;
}

/** The reference a library card is recorded as. */
export const refFor = (device: LibraryDevice): DeviceModelRef => ({ name: device.name, checksum: device.checksum });

/**
 * The form's next data after a change from `previous` to `next`: a newly chosen card fills the
 * device fields and the model; a change of IS, BF or VAF under a kept choice drops the choice and
 * the card's model (the values typed in are then the device).
 */
export function withDeviceChoice(previous: Draft, next: Draft, library: readonly LibraryDevice[] | undefined): Draft {
  const chosen = refOf(next.deviceModel);
  const before = refOf(previous.deviceModel);
  if (chosen && !sameRef(chosen, before)) {
    const card = libraryDeviceFor(chosen, library);
    if (!card) return next;
    const device = { ...((next.device as Draft | undefined) ?? {}) };
    for (const field of CARD_FIELDS) device[field] = card.device[field];
    device.model = { ...card.device.model };
    return { ...next, device };
  }
  if (chosen && sameRef(chosen, before)) {
    const was = (previous.device as Draft | undefined) ?? {};
    const now = (next.device as Draft | undefined) ?? {};
    if (CARD_FIELDS.some((field) => was[field] !== now[field])) {
      const { deviceModel: _dropped, ...rest } = next;
      const { model: _card, ...device } = now;
      return { ...rest, device };
    }
  }
  return next;
}

/** An object with no value in it (rjsf may leave keys holding `undefined`). */
const isEmptyRecord = (value: unknown) => value !== null && typeof value === 'object' && !Array.isArray(value) && Object.values(value).every((v) => v === undefined);

/** The object without its key `key` when that holds an empty record (the same object otherwise). */
function withoutEmpty(record: Draft, key: string): Draft {
  if (!isEmptyRecord(record[key])) return record;
  const { [key]: _empty, ...rest } = record;
  return rest;
}

/**
 * The draft without an empty `deviceModel`, `device.model`, `device.pnp` or `device.pnp.model`:
 * rjsf hands those back as `{}` for object fields nobody filled, and an empty one is no record of
 * a card (`deviceModel` would miss its name), no card (an empty `model` would make the typed device
 * a card of SPICE's defaults) and no PNP (the PNP section emptied again). What the form checks and
 * saves goes through this.
 */
export function withoutEmptyCard<T extends Draft>(draft: T): T {
  let out: Draft = withoutEmpty(draft, 'deviceModel');
  const device = out.device as Draft | undefined;
  if (device) {
    let next = withoutEmpty(device, 'model');
    const pnp = next.pnp as Draft | undefined;
    if (pnp) {
      const pnpNext = withoutEmpty(pnp, 'model');
      if (pnpNext !== pnp) next = { ...next, pnp: pnpNext };
      next = withoutEmpty(next, 'pnp');
    }
    if (next !== device) out = { ...out, device: next };
  }
  return out as T;
}
