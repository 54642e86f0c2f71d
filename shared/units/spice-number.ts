/**
 * SPICE numbers: the one reader and the one writer, used by the netlist writer and reader
 * (`shared/engine/netlist.ts`) and the `.model` card reader (`shared/devices/model-card.ts`).
 *
 * A SPICE3 number is an integer or a decimal with an optional exponent, then an optional scale
 * factor, then any letters, which SPICE ignores ("10pF", "1.2MEGohm", "5V") [SPICE: ngspice
 * manual, section 2.1.2 "Some naming conventions", Table 2.2 "Scale factors"]. Scale factors are
 * case-insensitive: M is milli in any case and MEG is mega; MIL is a thousandth of an inch.
 * Forms SPICE3 does not read ("4k7", "2m5", expressions) are refused, never guessed. The form
 * fields' own reading ("M" mega, "4k7") is `parse-quantity.ts`, not this.
 *
 * The reader is a single left-to-right scan (no regular expression over uploaded text), so it is
 * linear in the length of its input.
 */

/** SPICE3 scale factors as powers of ten, by first letter (ngspice manual, Table 2.2); MEG and MIL are read before these. */
export const SPICE_SCALE_EXPONENTS: Readonly<Record<string, number>> = { t: 12, g: 9, k: 3, m: -3, u: -6, n: -9, p: -12, f: -15 };
/** MEG: mega, 1e6 (same table). */
export const SPICE_MEG_EXPONENT = 6;
/** MIL: a thousandth of an inch in metres, 25.4e-6 (same table). */
export const SPICE_MIL = 25.4e-6;

const isDigit = (c: string) => c >= '0' && c <= '9';
const isLetter = (c: string) => (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z');

/**
 * Reads a SPICE number: `[+-]digits[.digits][e[+-]digits]`, then an optional scale factor and
 * any letters. Null when the text is not one (blanks included) or its value is not finite.
 */
export function readSpiceNumber(text: string): number | null {
  let i = 0;
  if (text[i] === '+' || text[i] === '-') i += 1;
  let digits = 0;
  // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent, text[text.length] is undefined, never a digit
  while (i < text.length && isDigit(text[i])) {
    i += 1;
    digits += 1;
  }
  if (text[i] === '.') {
    i += 1;
    // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent, text[text.length] is undefined, never a digit
  while (i < text.length && isDigit(text[i])) {
      i += 1;
      digits += 1;
    }
  }
  if (digits === 0) return null;
  const mantissa = text.slice(0, i);
  let exponent = 0;
  if (text[i] === 'e' || text[i] === 'E') {
    let j = i + 1;
    if (text[j] === '+' || text[j] === '-') j += 1;
    if (isDigit(text[j] ?? '')) {
      // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent, text[text.length] is undefined, never a digit
      while (j < text.length && isDigit(text[j])) j += 1;
      exponent = Number(text.slice(i + 1, j));
      i = j;
    }
  }
  const lettersStart = i;
  // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent, text[text.length] is undefined, never a letter
  while (i < text.length && isLetter(text[i])) i += 1;
  if (i !== text.length) return null; // "4k7", "2m5", "1.2.3", "1e-3*2": not SPICE3 numbers
  const letters = text.slice(lettersStart).toLowerCase();
  let value: number;
  if (letters.startsWith('meg')) value = Number(`${mantissa}e${exponent + SPICE_MEG_EXPONENT}`);
  else if (letters.startsWith('mil')) value = Number(`${mantissa}e${exponent}`) * SPICE_MIL;
  else {
    // Adding exponents (not multiplying by 1e-15) keeps "1.2f" exactly 1.2e-15 and "22p" 2.2e-11.
    const scale = letters.length > 0 ? (SPICE_SCALE_EXPONENTS[letters[0]] ?? 0) : 0;
    value = Number(`${mantissa}e${exponent + scale}`);
  }
  return Number.isFinite(value) ? value : null;
}

/** As `readSpiceNumber` (surrounding blanks allowed), but a SyntaxError for text that is not a finite SPICE number. */
export function parseSpiceNumber(text: string): number {
  const value = readSpiceNumber(text.trim());
  if (value === null) throw new SyntaxError(`not a SPICE number: "${text}"`);
  return value;
}

/**
 * Writes a number for SPICE: the shortest text that reads back as the same double (JavaScript's
 * round-trip form: "5100", "1.1e-14", "0.001"), which ngspice reads as written. Never a scale
 * factor, so nothing depends on M meaning milli. A RangeError for NaN and infinities.
 */
export function formatSpiceNumber(value: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`netlist value must be finite, got ${value}`);
  return String(value);
}
