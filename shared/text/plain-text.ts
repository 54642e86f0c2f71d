/**
 * User text (titles, names, reasons, comments, file names) is data everywhere: this module is
 * the one home for keeping it so. The API refuses the characters below in text fields (through
 * the JSON Schema patterns here); the writers of every file a tool reads (SPICE netlists, CSV,
 * e-mail) pass user text through `singleLine`, `commentLines` or `spreadsheetCell`, so text
 * stored before the check, or arriving another way, still cannot become a line of code.
 *
 * Refused and replaced: every C0 control (U+0000–U+001F: NUL, tab, LF, vertical tab, form feed,
 * CR, ESC …), DEL and the C1 controls (U+007F–U+009F, NEL U+0085 among them), the line and
 * paragraph separators U+2028/U+2029 (line breaks to many readers, JavaScript included), and the
 * bidirectional embeddings, overrides and isolates U+202A–U+202E and U+2066–U+2069, which make
 * text display in another order than it is stored (Unicode Technical Report #36, "Bidirectional
 * Text Spoofing"; CVE-2021-42574).
 */

/** One character class of everything refused in single-line text (see above). */
const UNSAFE_CLASS_BODY = '\\u0000-\\u001f\\u007f-\\u009f\\u2028\\u2029\\u202a-\\u202e\\u2066-\\u2069';
/** The same without LF, for multi-line fields (a reason, a comment, a description). */
const UNSAFE_MULTILINE_CLASS_BODY = '\\u0000-\\u0009\\u000b-\\u001f\\u007f-\\u009f\\u2028\\u2029\\u202a-\\u202e\\u2066-\\u2069';

/** JSON Schema `pattern` for single-line text: no control, separator or bidi-control character. */
export const PLAIN_LINE_PATTERN = `^[^${UNSAFE_CLASS_BODY}]*$`;
/** JSON Schema `pattern` for multi-line text: as PLAIN_LINE_PATTERN, but LF allowed (no CR: send LF line ends). */
export const PLAIN_LINES_PATTERN = `^[^${UNSAFE_MULTILINE_CLASS_BODY}]*$`;
/**
 * JSON Schema `pattern` for a single-line name: plain, and not blank. Written without lookahead
 * and with disjoint classes (blanks, then one non-blank, then the rest), so it runs in linear time.
 */
export const PLAIN_NAME_PATTERN = `^[^${UNSAFE_CLASS_BODY}\\S]*[^${UNSAFE_CLASS_BODY}\\s][^${UNSAFE_CLASS_BODY}]*$`;
/** JSON Schema `pattern` for an e-mail address: something@something, no blanks, no refused character. */
export const PLAIN_EMAIL_PATTERN = `^[^@\\s${UNSAFE_CLASS_BODY}]+@[^@\\s${UNSAFE_CLASS_BODY}]+$`;

const UNSAFE_CHAR = new RegExp(`[${UNSAFE_CLASS_BODY}]`, 'u');
const UNSAFE_CHARS = new RegExp(`[${UNSAFE_CLASS_BODY}]`, 'gu');
const UNSAFE_MULTILINE_CHAR = new RegExp(`[${UNSAFE_MULTILINE_CLASS_BODY}]`, 'u');
/** Every line break a reader might honour: CRLF, LF, CR, VT, FF, NEL, LS, PS. */
const LINE_BREAKS = /\r\n|[\n\r\u000b\u000c\u0085\u2028\u2029]/u;

/** How a refused character is named in a message: "U+000A (line feed)". */
const CHARACTER_NAMES: Record<number, string> = {
  0x00: 'NUL',
  0x09: 'tab',
  0x0a: 'line feed',
  0x0b: 'vertical tab',
  0x0c: 'form feed',
  0x0d: 'carriage return',
  0x1b: 'escape',
  0x85: 'next line',
  0x2028: 'line separator',
  0x2029: 'paragraph separator',
  0x202a: 'left-to-right embedding',
  0x202b: 'right-to-left embedding',
  0x202c: 'pop directional formatting',
  0x202d: 'left-to-right override',
  0x202e: 'right-to-left override',
  0x2066: 'left-to-right isolate',
  0x2067: 'right-to-left isolate',
  0x2068: 'first strong isolate',
  0x2069: 'pop directional isolate',
};

function describeCharacter(char: string): string {
  const code = char.codePointAt(0) ?? 0;
  const hex = `U+${code.toString(16).toUpperCase().padStart(4, '0')}`;
  const name = CHARACTER_NAMES[code] ?? (code >= 0x2000 ? 'formatting character' : 'control character');
  return `${hex} (${name})`;
}

/**
 * The first refused character of `text` with its position (from 1), or null when the text is
 * plain. `multiline` allows LF.
 */
export function firstUnsafeCharacter(text: string, multiline = false): { position: number; name: string } | null {
  const match = (multiline ? UNSAFE_MULTILINE_CHAR : UNSAFE_CHAR).exec(text);
  if (!match) return null;
  return { position: [...text.slice(0, match.index)].length + 1, name: describeCharacter(match[0]) };
}

/** The message a field gets when it holds a refused character ("must not contain U+000A (line feed) (character 12)…"). */
export function unsafeTextMessage(text: string, multiline = false): string | null {
  const found = firstUnsafeCharacter(text, multiline);
  if (!found) return null;
  const allowed = multiline ? 'line breaks as LF only; no other control characters' : 'one line of text; no line breaks, tabs or other control characters';
  return `must not contain ${found.name} (character ${found.position}): ${allowed}, and no bidirectional overrides`;
}

/** The text as one line: every refused character (line breaks included) becomes a blank. */
export function singleLine(text: string): string {
  return text.replace(UNSAFE_CHARS, ' ');
}

/**
 * The text as comment lines for a line-oriented file (a SPICE netlist): one line per line of the
 * text, each starting with `prefix` and cleaned by `singleLine`, so no line of it can begin
 * anything but a comment. The prefix must end in a blank (`"* "`): ngspice reads `*#` lines as
 * commands.
 */
export function commentLines(text: string, prefix: string): string[] {
  if (!/\s$/.test(prefix)) throw new RangeError('a comment prefix must end in a blank');
  return text.split(LINE_BREAKS).map((line) => `${prefix}${singleLine(line)}`.trimEnd());
}

/**
 * Text a spreadsheet would run as a formula (it starts with =, +, -, @, or a tab or carriage
 * return) gets a leading apostrophe, as OWASP's CSV-injection advice has it; other text is
 * unchanged. Apply to text cells, never to numbers (-3.2 stays a number).
 */
export function spreadsheetSafe(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

/** A text cell of a generated CSV: one line (refused characters blanked), then spreadsheet-safe. */
export function spreadsheetCell(text: string): string {
  return spreadsheetSafe(singleLine(text));
}

/** A number a spreadsheet reads as a number ("-3.5", "+2", "1e-3"): left as it is. */
const PLAIN_NUMBER = /^\s*[+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?\s*$/i;
/** Where a spreadsheet cell starts: line start (after a byte-order mark) or a delimiter (comma, semicolon, tab), then blanks and an optional quote. */
const CELL_START = /(^\uFEFF?|[,;\t])([ ]*"?)([=+\-@][^,;\t\r\n"]*)/gm;

/**
 * Delimited text as stored (an uploaded CSV), made safe to open in a spreadsheet: every cell
 * that starts with =, +, - or @ and is not a plain number gets a leading apostrophe (OWASP, "CSV
 * Injection"); numbers, and files without such cells, come back byte for byte. Cells are found
 * after each comma, semicolon and tab, with or without an opening quote, so a quoted cell that
 * holds a delimiter may gain an apostrophe inside it too (harmless in text, never in a figure).
 */
export function spreadsheetSafeDelimited(text: string): string {
  return text.replace(CELL_START, (whole, start: string, opening: string, cell: string) => (PLAIN_NUMBER.test(cell) ? whole : `${start}${opening}'${cell}`));
}
