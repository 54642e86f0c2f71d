/**
 * SPICE `.model` cards for NPN transistors, read from an uploaded library file by a small parser
 * of our own: pure, no I/O, nothing in a file ever evaluated, every step a single left-to-right
 * scan (no regular expressions over file text), so reading is linear in the file's size.
 *
 * Grammar accepted (SPICE3 / ngspice conventions [SPICE], see DEVELOPERS.md "Device models"):
 * - a text file (UTF-8 or ASCII) of `.model NAME NPN [(] NAME=VALUE … [)]` cards, any number
 *   of them (at most MODEL_FILE_MAX_CARDS), optionally ending with `.end`;
 * - `*` comment lines; end-of-line comments after `;`, `$ ` (dollar and a blank) or `//`;
 *   blank lines; `+` continuation lines; keywords, names and suffixes case-insensitive;
 * - fields separated by blanks, tabs or commas; `=` may have blanks around it; the parameter
 *   list may sit in one pair of parentheses (possibly over several lines) or in none;
 * - numbers as SPICE3 reads them (`shared/units/spice-number.ts`: scale factors T G MEG K M MIL
 *   U N P F, letters after them ignored); forms SPICE3 does not read ("4k7", "2m5",
 *   expressions) are refused, never guessed.
 * Anything else (.subckt, .include, .lib, .param, braces, quotes, element lines, PNP or other
 * device types, other dot-cards) is a problem with its line number; one problem refuses the file.
 *
 * What the engine reads from a card: the Gummel-Poon parameters of `shared/engine/bjt-parameters.ts`
 * (IS, BF, NF, VAF, IKF, ISE, NE, BR, …, CJE, CJC, CJS, TF, RB, …), which a spec filled from the
 * card carries as `device.model`; ngspice's other names for them (VA, IK, C2, VB, C4, PE, ME, PC,
 * MC, CSUB, CCS, PS, MS; and NK, TRB, TRC, TRE, TREF for SPICE-only ones) are read as theirs. IS, BF and VAF are required, even though SPICE has
 * defaults for them (IS = 1e-16 A, BF = 100, VAF infinite): a library card that leaves them out
 * would size the stage on values nobody chose. Write VAF=0 for no Early effect (SPICE reads 0 as
 * infinite). Their limits are the spec schema's.
 * Every other parameter ngspice's bipolar model knows (TNOM, ITF, XTF, VTF, PTF, XCJC, RBM, IRB,
 * ISS, NS, …: `SPICE_ONLY_PARAMETERS`) is kept with the card and written into every netlist the
 * product writes or simulates, so SPICE simulates the whole card; the engine does not model them
 * and the notes say so. A name ngspice does not know is kept with the card's text but written
 * into no netlist.
 */
import specSchema from '../schema/spec.schema.json';
import { BJT_PARAMETER_NAMES, type BjtModelCard, type BjtParameterName } from '../engine/bjt-parameters';
import { decodeUploadText, isStrayControl } from '../text/upload-text';
import { formatSpiceNumber, readSpiceNumber } from '../units/spice-number';

/** Largest library file, bytes (256 KiB). */
export const MODEL_FILE_MAX_BYTES = 256 * 1024;
/** Most `.model` cards in one file. */
export const MODEL_FILE_MAX_CARDS = 200;
/** Longest model name, characters. */
export const MODEL_NAME_MAX_LENGTH = 64;
/** Most parameters on one card (a full Gummel-Poon card has about 40). */
export const CARD_MAX_PARAMETERS = 150;
/** Longest word (name or value), characters. */
const MAX_WORD_LENGTH = 200;
/** Problems listed before the rest are summarised. */
const MAX_PROBLEMS = 50;

/** A problem with an uploaded file; `line` is 1-based, absent for the whole file. */
export interface CardProblem {
  line?: number;
  message: string;
}

/** One `.model` card as read. */
export interface ModelCard {
  /** The model name as written. */
  name: string;
  /** Line of the `.model` keyword, and the card's last line (its last `+` line). */
  line: number;
  lastLine: number;
  /** Every parameter, upper-case name → value in SI units, in card order (VA read as VAF). */
  parameters: Record<string, number>;
  /** The card's own lines as written (the `.model` line and its `+` lines). */
  text: string;
}

/** The device fields of the spec (`shared/schema/spec.schema.json`, `device`) a card fills. */
export interface CardDevice {
  family: 'npn';
  beta: number;
  saturationCurrentA: number;
  /** 0 means infinite (no Early effect), as SPICE reads VAF = 0. */
  earlyVoltageV: number;
  /** The card's Gummel-Poon parameters the engine models (`bjt-parameters.ts`), as the spec's `device.model` carries them. */
  model: BjtModelCard;
}

export type ModelFileResult = { ok: true; cards: ModelCard[] } | { ok: false; problems: CardProblem[] };

// ---------------------------------------------------------------------------------------------
// Characters

const isDigit = (c: string) => c >= '0' && c <= '9';
const isLetter = (c: string) => (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z');

// ---------------------------------------------------------------------------------------------
// Bytes to text

/**
 * The file's text, checked by content (never by its name) with the one upload check
 * (`shared/text/upload-text.ts`): not over the size limit, no NUL byte, valid UTF-8, and no more
 * than 1 % control characters (else it is binary). A UTF-8 byte order mark is dropped.
 */
export function decodeModelFile(bytes: Uint8Array): { ok: true; text: string } | { ok: false; problems: CardProblem[] } {
  const decoded = decodeUploadText(bytes, { maxBytes: MODEL_FILE_MAX_BYTES, controls: 'refuse-binary' });
  if (decoded.ok) return decoded;
  const problem = decoded.problem;
  switch (problem.kind) {
    case 'too-large':
      return fail(`The file is ${problem.bytes} bytes; a library file may hold at most ${MODEL_FILE_MAX_BYTES / 1024} KB.`);
    case 'nul':
      return fail('The file holds NUL bytes: it is binary (or UTF-16) rather than a text file of .model cards; save it as plain UTF-8 or ASCII text.', problem.line);
    case 'not-utf8':
      return fail('The file is not valid UTF-8 text here; save it as UTF-8 or plain ASCII.', problem.line);
    case 'control':
      return fail(`${problem.count} of the file's ${problem.length} characters are control characters: it looks binary, not a text file of .model cards.`, problem.line);
  }
}

function fail(message: string, line?: number): { ok: false; problems: CardProblem[] } {
  return { ok: false, problems: [line === undefined ? { message } : { line, message }] };
}

// ---------------------------------------------------------------------------------------------
// Lines and words

interface Token {
  kind: 'word' | '(' | ')' | '=';
  text: string;
  line: number;
}

/** A dot-card with its continuation lines. */
interface Statement {
  line: number;
  lastLine: number;
  tokens: Token[];
  lines: string[];
  /** A line of it had a problem already: no further checks, so one mistake is reported once. */
  broken: boolean;
}

/** Physical lines, split at CR LF, LF or CR. */
function splitLines(text: string): string[] {
  const lines: string[] = [];
  let start = 0;
  for (let i = 0; i < text.length; i += 1) {
    const c = text.charCodeAt(i);
    if (c === 0x0a || c === 0x0d) {
      lines.push(text.slice(start, i));
      if (c === 0x0d && text.charCodeAt(i + 1) === 0x0a) i += 1;
      start = i + 1;
    }
  }
  if (start < text.length) lines.push(text.slice(start));
  return lines;
}

const isBlank = (c: string) => c === ' ' || c === '\t' || c === '\f' || c === '\v';

/** The line without its end-of-line comment (`;`, `$ ` or `//`, as ngspice reads them). */
function withoutComment(line: string): string {
  for (let i = 0; i < line.length; i += 1) {
    const c = line[i];
    if (c === ';') return line.slice(0, i);
    if (c === '$' && (i + 1 === line.length || isBlank(line[i + 1]))) return line.slice(0, i);
    if (c === '/' && line[i + 1] === '/') return line.slice(0, i);
  }
  return line;
}

/** Short, printable form of a word for a message. */
function shown(text: string): string {
  return text.length > 40 ? `${text.slice(0, 37)}…` : text;
}

class Problems {
  readonly list: CardProblem[] = [];
  private dropped = 0;

  add(line: number | undefined, message: string): void {
    if (this.list.length >= MAX_PROBLEMS) {
      this.dropped += 1;
      return;
    }
    this.list.push(line === undefined ? { message } : { line, message });
  }

  get count(): number {
    return this.list.length + this.dropped;
  }

  result(): CardProblem[] {
    const sorted = [...this.list].sort((a, b) => (a.line ?? 0) - (b.line ?? 0));
    if (this.dropped > 0) sorted.push({ message: `…and ${this.dropped} more problems not listed.` });
    return sorted;
  }
}

/** Words and punctuation of one line's content; false when the line has a problem. */
function tokenize(content: string, line: number, into: Token[], problems: Problems): boolean {
  let word = '';
  const flush = (): boolean => {
    if (word === '') return true;
    if (word.length > MAX_WORD_LENGTH) {
      problems.add(line, `A word of ${word.length} characters ("${shown(word)}"): names and values are at most ${MAX_WORD_LENGTH}.`);
      word = '';
      return false;
    }
    into.push({ kind: 'word', text: word, line });
    word = '';
    return true;
  };
  for (let i = 0; i < content.length; i += 1) {
    const c = content[i];
    if (isBlank(c) || c === ',') {
      if (!flush()) return false;
    } else if (c === '(' || c === ')' || c === '=') {
      if (!flush()) return false;
      into.push({ kind: c, text: c, line });
    } else if (c === '{' || c === '}') {
      problems.add(line, 'Expressions in braces {…} are not supported: give every parameter as a plain number.');
      return false;
    } else if (c === "'" || c === '"') {
      problems.add(line, 'Quoted text or expressions are not supported: give every parameter as a plain number.');
      return false;
    } else if (isStrayControl(c.charCodeAt(0))) {
      problems.add(line, `A control character (U+${c.charCodeAt(0).toString(16).toUpperCase().padStart(4, '0')}) is not allowed in a card.`);
      return false;
    } else {
      word += c;
    }
  }
  return flush();
}

/** Why a dot-card other than `.model` and `.end` is refused. */
function unsupportedCard(keyword: string): string {
  switch (keyword) {
    case '.subckt':
    case '.ends':
      return 'Subcircuits (.subckt … .ends) are not supported: upload the plain .model cards.';
    case '.include':
    case '.inc':
    case '.lib':
    case '.endl':
      return `${keyword} is not supported: nothing is read from other files; upload the .model cards themselves.`;
    case '.param':
    case '.params':
    case '.parameters':
    case '.func':
    case '.csparam':
      return `${keyword} is not supported: give every parameter as a plain number in the card.`;
    case '.control':
    case '.endc':
      return 'Control blocks (.control … .endc) are not supported: a library file holds .model cards only.';
    default:
      return `Unknown card "${shown(keyword)}": a library file holds .model cards and comments only.`;
  }
}

/** Lines that skip everything up to their closing keyword, so one refused block is reported once. */
const BLOCK_ENDS: Record<string, string> = { '.subckt': '.ends', '.control': '.endc' };

// ---------------------------------------------------------------------------------------------
// Cards

interface Limit {
  minimum: number;
  maximum: number;
}

const DEVICE_FIELDS = specSchema.properties.device.properties;
const limitOf = (node: { minimum: number; maximum: number }): Limit => ({ minimum: node.minimum, maximum: node.maximum });
/** The spec schema's limits of the fields a card fills (one source of truth). */
const LIMITS = {
  IS: limitOf(DEVICE_FIELDS.saturationCurrentA),
  BF: limitOf(DEVICE_FIELDS.beta),
  VAF: limitOf(DEVICE_FIELDS.earlyVoltageV),
  /** VAF between 0 and this is refused (0 means infinite). */
  VAF_GAP: DEVICE_FIELDS.earlyVoltageV.not.exclusiveMaximum,
};

/** A number field of the schema's `device.model`: its bounds as written there. */
interface ModelFieldBounds {
  minimum?: number;
  exclusiveMinimum?: number;
  maximum?: number;
  not?: { exclusiveMinimum: number; exclusiveMaximum: number };
}

/** The spec schema's `device.model` fields (one source of truth for each parameter's bounds). */
const MODEL_FIELDS = DEVICE_FIELDS.model.properties as unknown as Record<string, ModelFieldBounds>;

/** Whether a value lies within a `device.model` field's bounds. */
function withinModelBounds(value: number, bounds: ModelFieldBounds): boolean {
  if (bounds.minimum !== undefined && !(value >= bounds.minimum)) return false;
  if (bounds.exclusiveMinimum !== undefined && !(value > bounds.exclusiveMinimum)) return false;
  if (bounds.maximum !== undefined && !(value <= bounds.maximum)) return false;
  if (bounds.not && value > bounds.not.exclusiveMinimum && value < bounds.not.exclusiveMaximum) return false;
  return true;
}

function boundsText(bounds: ModelFieldBounds): string {
  const low = bounds.exclusiveMinimum !== undefined ? `more than ${formatSpiceNumber(bounds.exclusiveMinimum)}` : `${formatSpiceNumber(bounds.minimum ?? -Infinity)}`;
  const gap = bounds.not ? ` (0, or at least ${formatSpiceNumber(bounds.not.exclusiveMaximum)})` : '';
  return `${low} to ${formatSpiceNumber(bounds.maximum ?? Infinity)}${gap}`;
}

/**
 * ngspice's other names of the parameters the engine reads (its BJT model table, bjt.c [SPICE]),
 * and TREF for TNOM: a card is stored under the one name.
 */
const ALIASES: Record<string, string> = {
  VA: 'VAF',
  IK: 'IKF',
  C2: 'ISE',
  VB: 'VAR',
  C4: 'ISC',
  PE: 'VJE',
  ME: 'MJE',
  PC: 'VJC',
  MC: 'MJC',
  CSUB: 'CJS',
  CCS: 'CJS',
  PS: 'VJS',
  MS: 'MJS',
  TREF: 'TNOM',
  NK: 'NKF',
  TRB: 'TRB1',
  TRC: 'TRC1',
  TRE: 'TRE1',
};

const REQUIRED: ReadonlyArray<[string, string]> = [
  ['IS', 'the saturation current'],
  ['BF', 'the forward current gain'],
  ['VAF', 'the forward Early voltage; write VAF=0 for none'],
];

function isParameterName(text: string): boolean {
  if (!isLetter(text[0] ?? '')) return false;
  for (let i = 1; i < text.length; i += 1) if (!(isLetter(text[i]) || isDigit(text[i]) || text[i] === '_')) return false;
  return true;
}

function isModelName(text: string): boolean {
  if (text.length === 0 || text.length > MODEL_NAME_MAX_LENGTH) return false;
  const c0 = text[0];
  if (!(isLetter(c0) || isDigit(c0) || c0 === '_')) return false;
  for (let i = 1; i < text.length; i += 1) {
    const c = text[i];
    if (!(isLetter(c) || isDigit(c) || c === '_' || c === '.' || c === '-' || c === '+')) return false;
  }
  return true;
}

/** A card's value in a message, as SPICE would read it back. */
const formatNumber = formatSpiceNumber;

/** Reads one `.model` statement; null when it has a problem (reported). */
function readModel(statement: Statement, problems: Problems): ModelCard | null {
  const [, nameToken, typeToken, ...rest] = statement.tokens;
  const at = statement.line;
  if (!nameToken || nameToken.kind !== 'word') {
    problems.add(at, 'The .model card has no model name: write .model NAME NPN (IS=… BF=… VAF=…).');
    return null;
  }
  if (!isModelName(nameToken.text)) {
    problems.add(nameToken.line, `Model name "${shown(nameToken.text)}": use up to ${MODEL_NAME_MAX_LENGTH} letters, digits and _ . - + (starting with a letter, digit or _).`);
    return null;
  }
  const name = nameToken.text;
  if (!typeToken || typeToken.kind !== 'word') {
    problems.add(at, `${name}: the card names no device type: write .model ${name} NPN (…).`);
    return null;
  }
  const type = typeToken.text.toUpperCase();
  if (type === 'PNP') {
    problems.add(typeToken.line, `${name}: PNP models are not supported; the library holds NPN transistor models only.`);
    return null;
  }
  if (type !== 'NPN') {
    problems.add(typeToken.line, `${name}: "${shown(typeToken.text)}" models are not supported; the library holds NPN transistor models only.`);
    return null;
  }

  const parameters: Record<string, number> = {};
  const firstLine = new Map<string, number>();
  const lineOf = new Map<string, number>();
  let open: Token | null = null;
  let closed = false;
  let bad = false;
  let i = 0;
  while (i < rest.length) {
    const token = rest[i];
    if (closed) {
      problems.add(token.line, `${name}: "${shown(token.text)}" after the closing parenthesis; the parameters go inside it.`);
      return null;
    }
    if (token.kind === '(') {
      if (open || Object.keys(parameters).length > 0 || bad) {
        problems.add(token.line, `${name}: unbalanced parentheses: a "(" inside the parameter list (only one pair around all parameters).`);
        return null;
      }
      open = token;
      i += 1;
      continue;
    }
    if (token.kind === ')') {
      if (!open) {
        problems.add(token.line, `${name}: unbalanced parentheses: ")" without a "(" before it.`);
        return null;
      }
      closed = true;
      i += 1;
      continue;
    }
    if (token.kind === '=') {
      problems.add(token.line, `${name}: "=" without a parameter name before it.`);
      return null;
    }
    const written = token.text;
    const equals = rest[i + 1];
    const valueToken = rest[i + 2];
    if (!isParameterName(written)) {
      problems.add(token.line, `${name}: "${shown(written)}" is not a parameter name (a letter, then letters, digits or _).`);
      return null;
    }
    if (!equals || equals.kind !== '=') {
      problems.add(token.line, `${name}: ${written} has no value: write ${written}=value.`);
      return null;
    }
    if (!valueToken || valueToken.kind !== 'word') {
      problems.add(equals.line, `${name}: ${written}= has no value after it.`);
      return null;
    }
    i += 3;
    const key = ALIASES[written.toUpperCase()] ?? written.toUpperCase();
    const value = readSpiceNumber(valueToken.text);
    if (value === null) {
      problems.add(valueToken.line, `${name}: ${written}=${shown(valueToken.text)} is not a SPICE number (digits, an optional exponent, then a scale factor T G MEG K M MIL U N P F).`);
      bad = true;
      continue;
    }
    const earlier = firstLine.get(key);
    if (earlier !== undefined) {
      problems.add(token.line, `${name}: ${key} is given twice (first on line ${earlier}).`);
      bad = true;
      continue;
    }
    firstLine.set(key, token.line);
    lineOf.set(key, valueToken.line);
    parameters[key] = value;
    if (firstLine.size > CARD_MAX_PARAMETERS) {
      problems.add(token.line, `${name}: more than ${CARD_MAX_PARAMETERS} parameters on one card.`);
      return null;
    }
  }
  if (open && !closed) {
    problems.add(open.line, `${name}: unbalanced parentheses: the "(" on line ${open.line} is never closed (the card ends on line ${statement.lastLine}).`);
    return null;
  }
  if (bad) return null;

  const before = problems.count;
  const level = parameters.LEVEL;
  if (level !== undefined && level !== 1) {
    problems.add(lineOf.get('LEVEL'), `${name}: LEVEL=${formatNumber(level)} selects another transistor model; only SPICE's Gummel-Poon model (LEVEL=1, the default) is supported.`);
  }
  for (const [key, what] of REQUIRED) {
    if (parameters[key] === undefined) problems.add(at, `${name}: ${key} is missing (${what}); the engine needs IS, BF and VAF.`);
  }
  const check = (key: 'IS' | 'BF', unit: string) => {
    const value = parameters[key];
    const { minimum, maximum } = LIMITS[key];
    if (value !== undefined && !(value >= minimum && value <= maximum)) {
      problems.add(lineOf.get(key), `${name}: ${key}=${formatNumber(value)}${unit} is outside what a spec accepts (${formatNumber(minimum)}${unit} to ${formatNumber(maximum)}${unit}).`);
    }
  };
  check('IS', ' A');
  check('BF', '');
  for (const key of BJT_PARAMETER_NAMES) {
    const value = parameters[key];
    const bounds = MODEL_FIELDS[key];
    if (key === 'IS' || key === 'BF' || key === 'VAF' || value === undefined || !bounds) continue;
    if (!withinModelBounds(value, bounds)) problems.add(lineOf.get(key), `${name}: ${key}=${formatNumber(value)} is outside what a spec's device model accepts (${boundsText(bounds)}).`);
  }
  const vaf = parameters.VAF;
  if (vaf !== undefined && vaf !== 0 && !(vaf >= LIMITS.VAF_GAP && vaf <= LIMITS.VAF.maximum)) {
    problems.add(lineOf.get('VAF'), `${name}: VAF=${formatNumber(vaf)} V is outside what a spec accepts (0 for none, or ${LIMITS.VAF_GAP} V to ${LIMITS.VAF.maximum} V).`);
  }
  if (problems.count > before) return null;
  return { name, line: at, lastLine: statement.lastLine, parameters, text: statement.lines.join('\n') };
}

/**
 * Reads the `.model` cards of a library file's text. All or nothing: any problem and the
 * result is the problems (sorted by line, at most 50 listed), never a partial list of cards.
 */
export function parseModelCards(text: string): ModelFileResult {
  const problems = new Problems();
  const statements: Statement[] = [];
  let current: Statement | null = null;
  let endLine: number | null = null;
  let skipUntil: string | null = null;
  const lines = splitLines(text);

  for (let index = 0; index < lines.length; index += 1) {
    const number = index + 1;
    const raw = lines[index];
    let start = 0;
    while (start < raw.length && isBlank(raw[start])) start += 1;
    if (start === raw.length || raw[start] === '*') continue;
    const content = withoutComment(raw.slice(start));
    if (content.trim() === '') continue;
    const first = content[0];

    if (skipUntil !== null) {
      if (first === '.' && content.slice(0, skipUntil.length).toLowerCase() === skipUntil) skipUntil = null;
      continue;
    }
    if (endLine !== null) {
      problems.add(number, `Nothing may follow .end (line ${endLine}) but comments.`);
      continue;
    }
    if (first === '+') {
      if (!current) {
        problems.add(number, 'A continuation line (+) with no .model card before it.');
        continue;
      }
      current.lastLine = number;
      current.lines.push(raw.trimEnd());
      if (!current.broken && !tokenize(content.slice(1), number, current.tokens, problems)) current.broken = true;
      continue;
    }
    current = null;
    if (first !== '.') {
      problems.add(number, `Only .model cards and comments are accepted; "${shown(content.trim().split(' ')[0])}" looks like a circuit element line.`);
      continue;
    }
    const statement: Statement = { line: number, lastLine: number, tokens: [], lines: [raw.trimEnd()], broken: false };
    if (!tokenize(content, number, statement.tokens, problems)) statement.broken = true;
    const keyword = (statement.tokens[0]?.text ?? content.trim()).toLowerCase();
    if (keyword === '.model') {
      statements.push(statement);
      current = statement;
    } else if (keyword === '.end') {
      endLine = number;
    } else {
      if (!statement.broken) problems.add(number, unsupportedCard(keyword));
      skipUntil = BLOCK_ENDS[keyword] ?? null;
      // A refused card's + lines belong to it: they are not reported again.
      current = { ...statement, broken: true };
    }
  }

  const cards: ModelCard[] = [];
  const seen = new Map<string, number>();
  for (const statement of statements) {
    if (statement.broken) continue;
    const card = readModel(statement, problems);
    if (!card) continue;
    const key = card.name.toLowerCase();
    const earlier = seen.get(key);
    if (earlier !== undefined) {
      problems.add(card.line, `${card.name}: a second card of this name (the first is on line ${earlier}); names are case-insensitive in SPICE.`);
      continue;
    }
    seen.set(key, card.line);
    cards.push(card);
  }
  if (statements.length > MODEL_FILE_MAX_CARDS) {
    problems.add(statements[MODEL_FILE_MAX_CARDS].line, `More than ${MODEL_FILE_MAX_CARDS} .model cards in one file: split it.`);
  }
  if (problems.count === 0 && cards.length === 0) problems.add(undefined, 'The file holds no .model card.');
  return problems.count > 0 ? { ok: false, problems: problems.result() } : { ok: true, cards };
}

/** Checks the bytes (`decodeModelFile`), then reads the cards (`parseModelCards`). */
export function readModelFile(bytes: Uint8Array): ModelFileResult {
  const decoded = decodeModelFile(bytes);
  return decoded.ok ? parseModelCards(decoded.text) : decoded;
}

// ---------------------------------------------------------------------------------------------
// What the product does with a card

const ENGINE_PARAMETERS: ReadonlySet<string> = new Set<string>(BJT_PARAMETER_NAMES);

/**
 * The model parameters of ngspice's bipolar transistor (BJT level 1, its model table in bjt.c
 * [SPICE]) beyond the engine's (`bjt-parameters.ts`), by their upper-case names (the other names
 * read as theirs by ALIASES). A card's values of these are written into every netlist, so SPICE
 * simulates them; the engine does not model them.
 */
export const SPICE_ONLY_PARAMETERS: ReadonlySet<string> = new Set([
  'SUBS', 'TNOM', 'IBE', 'IBC', 'IRB', 'RBM', 'XTF', 'VTF', 'ITF', 'PTF', 'XCJC', 'ISS', 'NS',
  'RCO', 'VO', 'GAMMA', 'QCO', 'QUASIMOD', 'VG', 'CN', 'D', 'NKF', 'NK', 'TLEV', 'TLEVC',
  'TBF1', 'TBF2', 'TBR1', 'TBR2', 'TIKF1', 'TIKF2', 'TIKR1', 'TIKR2', 'TIRB1', 'TIRB2', 'TNC1', 'TNC2',
  'TNE1', 'TNE2', 'TNF1', 'TNF2', 'TNR1', 'TNR2', 'TRB1', 'TRB', 'TRB2', 'TRC1', 'TRC', 'TRC2',
  'TRE1', 'TRE', 'TRE2', 'TRM1', 'TRM2', 'TVAF1', 'TVAF2', 'TVAR1', 'TVAR2', 'CTC', 'CTE', 'CTS',
  'TVJC', 'TVJE', 'TVJS', 'TITF1', 'TITF2', 'TTF1', 'TTF2', 'TTR1', 'TTR2', 'TMJE1', 'TMJE2',
  'TMJC1', 'TMJC2', 'TMJS1', 'TMJS2', 'TNS1', 'TNS2', 'TIS1', 'TIS2', 'TISE1', 'TISE2', 'TISC1',
  'TISC2', 'TISS1', 'TISS2', 'VBE_MAX', 'VBC_MAX', 'VCE_MAX', 'PD_MAX', 'IC_MAX', 'IB_MAX', 'TE_MAX', 'RTH0',
]);

/**
 * Of the SPICE-only parameters, those that change only the charges (transit time and its bias
 * dependence, the split of CJC, the capacitances' temperature coefficients): they move figures
 * over frequency, never the operating point. The safe-operating limits (…_MAX) change nothing
 * ngspice computes. Every other SPICE-only parameter moves the operating point too.
 */
const CHARGE_ONLY_PARAMETERS: ReadonlySet<string> = new Set([
  'XTF', 'VTF', 'ITF', 'PTF', 'XCJC', 'CTC', 'CTE', 'CTS', 'TVJC', 'TVJE', 'TVJS', 'TITF1', 'TITF2',
  'TTF1', 'TTF2', 'TTR1', 'TTR2', 'TMJE1', 'TMJE2', 'TMJC1', 'TMJC2', 'TMJS1', 'TMJS2',
]);
const NO_EFFECT_PARAMETERS: ReadonlySet<string> = new Set(['VBE_MAX', 'VBC_MAX', 'VCE_MAX', 'PD_MAX', 'IC_MAX', 'IB_MAX', 'TE_MAX']);

/** Whether a SPICE-only parameter can move a figure of this kind ('dc': operating point and low-frequency; 'ac': at a frequency). */
export function spiceOnlyParameterMoves(name: string, kind: 'dc' | 'ac'): boolean {
  if (!SPICE_ONLY_PARAMETERS.has(name) || NO_EFFECT_PARAMETERS.has(name)) return false;
  return kind === 'ac' || !CHARGE_ONLY_PARAMETERS.has(name);
}

/** The card's parameters the engine models (`bjt-parameters.ts`), as the spec's `device.model`. */
export function cardModel(parameters: Readonly<Record<string, number>>): BjtModelCard {
  const model: BjtModelCard = {};
  for (const name of BJT_PARAMETER_NAMES) if (parameters[name] !== undefined) model[name as BjtParameterName] = parameters[name];
  return model;
}

/** The card's parameters SPICE reads and the engine does not model (`SPICE_ONLY_PARAMETERS`), in card order. */
export function cardSpiceOnlyParameters(parameters: Readonly<Record<string, number>>): Record<string, number> {
  const out: Record<string, number> = {};
  for (const [name, value] of Object.entries(parameters)) if (SPICE_ONLY_PARAMETERS.has(name)) out[name] = value;
  return out;
}

/** Names on the card that neither the engine nor ngspice's bipolar model knows (LEVEL aside). */
function unknownParameters(parameters: Readonly<Record<string, number>>): string[] {
  return Object.keys(parameters).filter((name) => name !== 'LEVEL' && !ENGINE_PARAMETERS.has(name) && !SPICE_ONLY_PARAMETERS.has(name));
}

/** The spec's device fields a card fills: IS, BF, VAF (a parsed card always has them) and `model`, every parameter the engine models. */
export function cardDevice(parameters: Readonly<Record<string, number>>): CardDevice {
  return { family: 'npn', beta: parameters.BF, saturationCurrentA: parameters.IS, earlyVoltageV: parameters.VAF, model: cardModel(parameters) };
}

const listed = (names: string[]) => (names.length > 10 ? `${names.slice(0, 10).join(', ')}, …` : names.join(', '));
const plural = (n: number, one: string, many: string) => (n === 1 ? one : many);

/** What a reader should know about how the engine and SPICE use a card. */
export function cardNotes(parameters: Readonly<Record<string, number>>): string[] {
  const notes: string[] = [];
  const spiceOnly = Object.keys(cardSpiceOnlyParameters(parameters));
  if (spiceOnly.length > 0) {
    notes.push(
      `The engine does not model the card's ${listed(spiceOnly)}; ${plural(spiceOnly.length, 'it is', 'they are')} written into every netlist and simulated in the SPICE check, so SPICE may differ from the estimates where ${plural(spiceOnly.length, 'it matters', 'they matter')}.`,
    );
  }
  const tnom = parameters.TNOM;
  if (tnom !== undefined && tnom !== 27) notes.push(`TNOM = ${formatNumber(tnom)} °C in the card: SPICE reads the card's values at ${formatNumber(tnom)} °C, the engine at 27 °C.`);
  const unknown = unknownParameters(parameters);
  if (unknown.length > 0) {
    notes.push(`${listed(unknown)} ${plural(unknown.length, 'is not a parameter', 'are not parameters')} of SPICE's bipolar model: kept with the card's text, written into no netlist.`);
  }
  return notes;
}

/** Where a stored card came from, for the exported netlist's comment. */
export interface CardOrigin {
  name: string;
  fileName: string;
  checksum: string;
  text: string;
}

/**
 * The texts of the comment lines for an exported netlist: the library card the device came
 * from, for `spiceNetlist`'s header comments (which write each behind `* `, so SPICE never reads
 * it). The netlist's `.model` card is the whole card (`spiceOnly`: the parameters the engine does
 * not model, written after the design's own); the card as written follows for reference.
 */
export function cardCommentLines(origin: CardOrigin, spiceOnly: readonly string[] = []): string[] {
  return [
    `Device from the project's library: ${origin.name} (file ${origin.fileName}, sha256 ${origin.checksum.slice(0, 16)}…).`,
    spiceOnly.length > 0
      ? `The .model card below carries every parameter of the card; the engine does not model ${listed([...spiceOnly])}, so SPICE may differ from the estimates there.`
      : 'The .model card below carries every parameter of the card, each of them modelled by the engine.',
    'The card as written in the library file:',
    ...splitLines(origin.text).map((line) => `  ${line}`),
  ];
}
