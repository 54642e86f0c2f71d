import type { OptionFacts } from '#shared/engine/types';
import { formatFixed } from '#shared/units/figures';
import { formatQuantity } from '#shared/units/format-quantity';
import { FACT_KINDS, isFactName, type FactKind } from './fact-kinds';

/**
 * Reason templates: plain text with placeholders `{fact:format}` or `{fact:si:unit}`; writing
 * the fact as `|fact|` prints its magnitude ("3.1 dB short" for a margin of −3.1 dB). Formatting
 * only rounds and picks a prefix: it never derives a new quantity (rules compare, the engine
 * computes). Example: `{powerWorstW:si:W}` -> "28.4 mW", `{cmrrFrequencyHz:hz}` -> "DC" for 0.
 */
const PLACEHOLDER = /\{(\|?)([A-Za-z][A-Za-z0-9]*)\1:([A-Za-z0-9]+)(?::([^{}:]+))?\}/g;

type ValueKind = 'number' | 'text' | 'text-list';

interface Format {
  kind: ValueKind;
  takesUnit: boolean;
  apply(value: never, unit: string): string;
}

/** Typographic minus (U+2212) for negative figures, as in "ICM −2 V". */
function withMinus(text: string): string {
  return text.replace(/^-/, '\u2212');
}

/** At most one decimal, trailing zero dropped (shared/units/figures.ts); a nonzero value that rounds to 0 keeps one significant digit. */
function fixed1(x: number): string {
  const text = formatFixed(x, 1, { trimZeros: true });
  return text === '0' && x !== 0 ? withMinus(String(Number(x.toPrecision(1)))) : text;
}

/** Three significant digits with an engineering prefix: 0.0284, "W" -> "28.4 mW" (shared/units). */
function si(x: number, unit: string): string {
  return formatQuantity(x, unit);
}

const FORMATS: Readonly<Record<string, Format>> = {
  dB1: { kind: 'number', takesUnit: false, apply: (x: number) => `${fixed1(x)} dB` },
  pct1: { kind: 'number', takesUnit: false, apply: (x: number) => `${fixed1(x)} %` },
  degC: { kind: 'number', takesUnit: false, apply: (x: number) => `${fixed1(x)} °C` },
  hz: { kind: 'number', takesUnit: false, apply: (x: number) => (x === 0 ? 'DC' : si(x, 'Hz')) },
  si: { kind: 'number', takesUnit: true, apply: (x: number, unit: string) => si(x, unit) },
  num: { kind: 'number', takesUnit: false, apply: (x: number) => withMinus(String(Number(x.toPrecision(3)))) },
  int: { kind: 'number', takesUnit: false, apply: (x: number) => withMinus(String(Math.round(x))) },
  text: { kind: 'text', takesUnit: false, apply: (s: string) => s },
  list: { kind: 'text-list', takesUnit: false, apply: (items: string[]) => (items.length ? items.join('; ') : 'none') },
};

const ACCEPTS: Readonly<Record<ValueKind, readonly FactKind[]>> = {
  number: ['number', 'number-or-null'],
  text: ['text'],
  'text-list': ['text-list'],
};

/** Problems with a template (unknown fact or format, wrong kind, stray brace); empty when sound. */
export function templateProblems(template: string): string[] {
  const problems: string[] = [];
  for (const [placeholder, bars, fact, formatName, unit] of template.matchAll(PLACEHOLDER)) {
    const format = FORMATS[formatName];
    if (!isFactName(fact)) problems.push(`${placeholder}: unknown fact "${fact}"`);
    else if (!format) problems.push(`${placeholder}: unknown format "${formatName}"`);
    else if (!ACCEPTS[format.kind].includes(FACT_KINDS[fact]))
      problems.push(`${placeholder}: format "${formatName}" does not fit a ${FACT_KINDS[fact]} fact`);
    else if (format.takesUnit !== (unit !== undefined))
      problems.push(`${placeholder}: format "${formatName}" ${format.takesUnit ? 'needs' : 'takes no'} unit`);
    else if (bars && format.kind !== 'number') problems.push(`${placeholder}: |…| applies to numbers only`);
  }
  if (/[{}]/.test(template.replace(PLACEHOLDER, ''))) problems.push('malformed placeholder (stray brace)');
  return problems;
}

function describe(value: unknown): string {
  return typeof value === 'number' ? String(value) : (JSON.stringify(value) ?? 'undefined');
}

function valueFits(kind: ValueKind, value: unknown): boolean {
  if (kind === 'number') return typeof value === 'number' && Number.isFinite(value);
  if (kind === 'text') return typeof value === 'string';
  return Array.isArray(value) && value.every((item) => typeof item === 'string');
}

/** Fills a template from the facts; throws when a fact is missing or not of the format's kind (e.g. null, NaN). */
export function formatReason(template: string, facts: Readonly<OptionFacts>): string {
  return template.replace(PLACEHOLDER, (placeholder, bars: string, fact: string, formatName: string, unit?: string) => {
    const format = FORMATS[formatName];
    const value: unknown = (facts as unknown as Record<string, unknown>)[fact];
    if (!format || !valueFits(format.kind, value)) {
      throw new Error(`${placeholder}: fact "${fact}" is ${describe(value)}, not a ${format?.kind ?? 'known format'} value`);
    }
    const shown = bars ? Math.abs(value as number) : value;
    return format.apply(shown as never, unit ?? '');
  });
}
