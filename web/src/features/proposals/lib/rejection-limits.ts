/**
 * What limits an option's rejection at the spec frequency, as rows to show (the engine's
 * `rejectionLimits`, shared/engine/rejection-limits.ts): each part named with its elements and
 * their values, its share, and the rejection with it removed. Parts under SMALL_SHARE_PERCENT are
 * summed into one row so the parts that matter stand out.
 */
import type { RejectionLimit, RejectionLimitElement, RejectionLimitPart, RejectionLimits } from '#shared/engine/rejection-limits';
import { formatDb, formatPercent } from '#shared/units/figures';
import { formatQuantity } from '#shared/units/format-quantity';

/** A part below this share (per cent) goes into the "other parts" row. */
export const SMALL_SHARE_PERCENT = 1;
/** The lead sentence names the largest parts until together they hold this share (per cent). */
const LEAD_SHARE_PERCENT = 60;
const LEAD_PARTS_AT_MOST = 3;

const PART_NAMES: Record<RejectionLimitPart, string> = {
  'tail-resistance': 'Tail output resistance',
  'tail-base-collector': 'Tail transistor CJC',
  'tail-collector-substrate': 'Tail transistor CJS',
  'tail-base-emitter': 'Tail transistor CJE + TF',
  'tail-wiring': 'Tail wiring capacitance',
  'pair-base-emitter': 'Pair CJE + TF',
  'pair-base-collector': 'Pair CJC',
  'pair-collector-substrate': 'Pair CJS',
  load: 'Load',
  pair: 'Pair transistors’ own conductances',
};

/** What each part is, in a few words (the row's note). */
const PART_NOTES: Record<RejectionLimitPart, string> = {
  'tail-resistance': 'the tail’s DC output resistance',
  'tail-base-collector': 'base–collector capacitance from the tail node',
  'tail-collector-substrate': 'collector–substrate capacitance from the tail node',
  'tail-base-emitter': 'base–emitter junction and diffusion capacitance',
  'tail-wiring': 'from the spec: wiring from t to AC ground',
  'pair-base-emitter': 'base–emitter junction and diffusion capacitance',
  'pair-base-collector': 'feeds the input’s common mode straight to the collector',
  'pair-collector-substrate': 'collector to the negative rail',
  load: 'collector resistors and load capacitance',
  pair: 'with their mismatch: see the mismatch shares in the checks',
};

export interface RejectionLimitRow {
  part: RejectionLimitPart | 'other';
  name: string;
  note: string;
  /** The elements with their values, e.g. "Q4 1.48 pF"; empty for the "other" row. */
  elements: string;
  sharePercent: number;
  share: string;
  /** "79.1 dB (+11.8 dB)", or "" where there is nothing to remove. */
  without: string;
}

export interface RejectionLimitView {
  /** One sentence: the rejection, the output, the frequency and the condition. */
  heading: string;
  /** One sentence: the parts that set it, the largest first until they hold LEAD_SHARE_PERCENT (three at most). */
  lead: string;
  rows: RejectionLimitRow[];
  /** Parts working against the common mode, worded. */
  offsetting: string[];
}

const lowerFirst = (text: string) => text.charAt(0).toLowerCase() + text.slice(1);

function elementText(e: RejectionLimitElement): string {
  if (e.name === 'tail' && e.resistanceOhm !== undefined) return formatQuantity(e.resistanceOhm, 'Ohm');
  if (e.capacitanceF !== undefined) return `${e.name} ${formatQuantity(e.capacitanceF, 'F')}`;
  if (e.resistanceOhm !== undefined) return `${e.name} ${formatQuantity(e.resistanceOhm, 'Ohm')}`;
  return e.name;
}

function withoutText(limit: RejectionLimit, rejectionDb: number): string {
  if (limit.rejectionWithoutDb === null) return '';
  return `${formatDb(limit.rejectionWithoutDb)} (${formatDb(limit.rejectionWithoutDb - rejectionDb, { sign: 'exceptZero' })})`;
}

function row(limit: RejectionLimit, rejectionDb: number): RejectionLimitRow {
  return {
    part: limit.part,
    name: PART_NAMES[limit.part],
    note: PART_NOTES[limit.part],
    elements: limit.elements.map(elementText).join(', '),
    sharePercent: limit.sharePercent,
    share: formatPercent(limit.sharePercent, { decimals: 0 }),
    without: withoutText(limit, rejectionDb),
  };
}

/** The rows of an option's rejection limits, or null when the option has none (unsolved, or ranked before they existed). */
export function rejectionLimitView(limits: RejectionLimits | null | undefined, frequencyText: string): RejectionLimitView | null {
  if (!limits || limits.limits.length === 0) return null;
  const big = limits.limits.filter((l) => l.sharePercent >= SMALL_SHARE_PERCENT);
  const small = limits.limits.filter((l) => l.sharePercent < SMALL_SHARE_PERCENT);
  const rows = big.map((l) => row(l, limits.rejectionDb));
  if (small.length > 0) {
    const sharePercent = small.reduce((s, l) => s + l.sharePercent, 0);
    rows.push({
      part: 'other',
      name: small.length === 1 ? PART_NAMES[small[0].part] : `${small.length} other parts`,
      note: small.length === 1 ? PART_NOTES[small[0].part] : small.map((l) => PART_NAMES[l.part]).join(', '),
      elements: '',
      sharePercent,
      share: sharePercent < 0.5 ? '< 1 %' : formatPercent(sharePercent, { decimals: 0 }),
      without: '',
    });
  }
  const output = limits.output === 'differential' ? 'differential (mismatch-limited, every mismatch at its worst case)' : 'single-ended';
  const heading = `At ${frequencyText} and ${limits.conditionLabel} (the condition that governs it) the ${output} rejection is ${formatDb(limits.rejectionDb)}.`;
  const leading: RejectionLimit[] = [];
  for (const l of limits.limits) {
    if (leading.length === LEAD_PARTS_AT_MOST || leading.reduce((s, p) => s + p.sharePercent, 0) >= LEAD_SHARE_PERCENT) break;
    leading.push(l);
  }
  const named = leading.map((l) => `${lowerFirst(PART_NAMES[l.part])}${l.elements.length ? ` (${l.elements.map(elementText).join(', ')})` : ''}, ${formatPercent(l.sharePercent, { decimals: 0 })}`);
  const lead = `${leading.length === 1 && leading[0].sharePercent >= 90 ? 'Set by' : 'Mostly'} ${named.length > 1 ? `${named.slice(0, -1).join('; ')} and ${named.at(-1)}` : named[0]}.`;
  const offsetting = limits.offsetting
    .filter((l) => -l.sharePercent >= SMALL_SHARE_PERCENT)
    .map((l) => {
      const parts = `${PART_NAMES[l.part]}${l.elements.length ? ` (${l.elements.map(elementText).join(', ')})` : ''}`;
      const without = l.rejectionWithoutDb === null ? '' : `; without it the rejection would be ${formatDb(l.rejectionWithoutDb)}`;
      return `${parts} works against the common mode (${formatPercent(l.sharePercent, { decimals: 0, sign: 'exceptZero' })})${without}.`;
    });
  return { heading, lead, rows, offsetting };
}
