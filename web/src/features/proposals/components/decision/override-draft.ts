/**
 * The override editor's state as typed text, and the design it reads as. Pure: the text is kept
 * exactly as typed (nothing is lost on a failed request); the design exists only when every
 * field reads as a value the schema allows.
 */
import type { Design, TailDesign, TopologyId } from '#shared/engine/types';
import { formatQuantity, parseQuantity } from '#shared/units/index';
import { ApiError } from '../../../../lib/api';
import { fieldText, fieldValue, fieldsFor, TAIL_FIELD_KEYS, type FieldInfo, type FieldKey } from './design-fields';

export interface OverrideDraft {
  /** The design the draft started from: device, rails, common mode, temperature and tail capacitance come from it. */
  base: Design;
  topology: TopologyId;
  text: Partial<Record<FieldKey, string>>;
}

/** A field's text read as a value (ohms, or a plain ratio), or why it cannot be used. */
export type FieldReading = { ok: true; value: number } | { ok: false; message: string };

/** Enough digits that a value read back from its text is the value itself (E192 needs three). */
const TEXT_DIGITS = 6;

/** A value as the editor shows it to start with: "13.7 kΩ"; a ratio as the plain number typed ("8"). */
export function valueText(value: number, unit: string): string {
  return formatQuantity(value, unit, TEXT_DIGITS);
}

/** A ratio may be typed with its sign ("8×", "8x", "8 ×"): the number is what counts. */
const RATIO_SIGN = /\s*[×xX]$/;

/** The typed text read as ohms (or a plain ratio) and checked against the schema's limits, or why it cannot be used. */
export function readField(info: FieldInfo, text: string | undefined): FieldReading {
  const typed = info.kind === 'ratio' ? (text ?? '').trim().replace(RATIO_SIGN, '') : (text ?? '');
  const parsed = parseQuantity(typed, info.unit);
  if (!parsed.ok) return { ok: false, message: parsed.message.startsWith('"') ? parsed.message : `This value ${parsed.message}` };
  const value = parsed.value;
  const limit = fieldText(info, info.min, TEXT_DIGITS);
  if (info.minAllowed ? value < info.min : value <= info.min) return { ok: false, message: `Must be ${info.minAllowed ? 'at least' : 'more than'} ${limit}` };
  if (value > info.max) return { ok: false, message: `Must be at most ${fieldText(info, info.max, TEXT_DIGITS)}` };
  return { ok: true, value };
}

/** The text of every field of a design's topology. */
function textsOf(design: Design, topology: TopologyId): Partial<Record<FieldKey, string>> {
  const text: Partial<Record<FieldKey, string>> = {};
  for (const info of fieldsFor(topology)) {
    const value = fieldValue(design, info.key);
    text[info.key] = value === undefined ? '' : valueText(value, info.unit);
  }
  return text;
}

/** A draft holding a design's values. */
export function draftFromDesign(design: Design): OverrideDraft {
  return { base: design, topology: design.tail.topology, text: textsOf(design, design.tail.topology) };
}

/**
 * The draft with another topology: the pair's values stay as typed; the tail's come from the
 * ranked option of that topology, or stay as typed when it has none.
 */
export function withTopology(draft: OverrideDraft, topology: TopologyId, rankedDesign: Design | null): OverrideDraft {
  const tailText = rankedDesign ? textsOf(rankedDesign, topology) : {};
  const text: Partial<Record<FieldKey, string>> = {};
  for (const info of fieldsFor(topology)) {
    text[info.key] = info.key.startsWith('tail/') ? (tailText[info.key] ?? draft.text[info.key] ?? '') : (draft.text[info.key] ?? '');
  }
  return { ...draft, topology, text };
}

/** Every field's reading for the draft's topology. */
export function readDraft(draft: OverrideDraft): Map<FieldKey, FieldReading> {
  return new Map(fieldsFor(draft.topology).map((info) => [info.key, readField(info, draft.text[info.key])]));
}

/** The design the draft stands for, or null while any field cannot be read. */
export function designFromDraft(draft: OverrideDraft): Design | null {
  const values: Partial<Record<FieldKey, number>> = {};
  for (const [key, reading] of readDraft(draft)) {
    if (!reading.ok) return null;
    values[key] = reading.value;
  }
  const tail = { topology: draft.topology } as Record<string, unknown>;
  for (const [key, value] of Object.entries(values)) if (key.startsWith('tail/')) tail[key.slice('tail/'.length)] = value;
  return {
    ...draft.base,
    collectorResistanceOhm: values.collectorResistanceOhm!,
    pairEmitterResistanceOhm: values.pairEmitterResistanceOhm!,
    tail: tail as unknown as TailDesign,
  };
}

/** Server paths ("/design/tail/emitterResistanceOhm", "/tail/areaRatio") as field keys, when they name one. */
export function fieldKeyOfPath(path: string): FieldKey | null {
  const key = path.replace(/^\/design\//, '').replace(/^\//, '');
  const known: FieldKey[] = ['collectorResistanceOhm', 'pairEmitterResistanceOhm', ...TAIL_FIELD_KEYS];
  return known.find((k) => key === k) ?? null;
}

/** A 400's details as messages by field (paths that name no editable field are left to the caller); nothing for other errors. */
export function fieldErrorsOf(error: unknown): Partial<Record<FieldKey, string>> {
  if (!(error instanceof ApiError) || error.status !== 400) return {};
  const errors: Partial<Record<FieldKey, string>> = {};
  for (const detail of error.details) {
    const key = fieldKeyOfPath(detail.path);
    if (key) errors[key] = `The server says: ${detail.message}`;
  }
  return errors;
}
