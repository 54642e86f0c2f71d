/**
 * The .model card reader (shared/devices/model-card.ts).
 *
 * Expected values are written from the cards' text with the SPICE3 scale factors as the
 * ngspice User's Manual lists them ("Some naming conventions", Table 2.2 "Ngspice scale
 * factors"): T = 1e12, G = 1e9, MEG = 1e6, K = 1e3, MIL = 25.4e-6, M = 1e-3, U = 1e-6,
 * N = 1e-9, P = 1e-12, F = 1e-15; letters after a number or a factor are ignored; M is milli,
 * never mega [SPICE]. The comment forms are ngspice's (`*` lines; `;`, `$ ` and `//` to the end
 * of a line; `+` continuations). The device names and values are invented.
 */
import { commentLines } from '#shared/text/plain-text';
import { describe, expect, test } from 'vitest';
import {
  cardCommentLines,
  cardDevice,
  cardNotes,
  cardSpiceOnlyParameters,
  decodeModelFile,
  spiceOnlyParameterMoves,
  MODEL_FILE_MAX_BYTES,
  parseModelCards,
  readModelFile,
  type ModelCard,
} from '#shared/devices/model-card';

const bytes = (text: string) => new TextEncoder().encode(text);

interface GoodCase {
  when: string;
  text: string;
  cards: Array<Pick<ModelCard, 'name' | 'line' | 'lastLine'> & { parameters: Record<string, number> }>;
}

const GOOD: GoodCase[] = [
  {
    when: 'one card on one line, no parentheses',
    text: '.model FH-N1 NPN IS=1e-14 BF=200 VAF=100\n',
    cards: [{ name: 'FH-N1', line: 1, lastLine: 1, parameters: { IS: 1e-14, BF: 200, VAF: 100 } }],
  },
  {
    when: 'parenthesised over several + lines with suffixes',
    text: ['.model FH-N2 NPN (IS=1.2f', '+ BF=150', '+ VAF=74.5 RB=10 RE=0.5', '+ CJE=22p TF=350p)'].join('\n'),
    cards: [{ name: 'FH-N2', line: 1, lastLine: 4, parameters: { IS: 1.2e-15, BF: 150, VAF: 74.5, RB: 10, RE: 0.5, CJE: 22e-12, TF: 350e-12 } }],
  },
  {
    when: 'lower case, = with blanks, commas, tabs, a CR LF file',
    text: '.model fh-n3 npn ( is = 8f ,\tbf= 1.5K , vaf =0.25k, rbm=1meg )\r\n',
    cards: [{ name: 'fh-n3', line: 1, lastLine: 1, parameters: { IS: 8e-15, BF: 1500, VAF: 250, RBM: 1e6 } }],
  },
  {
    when: 'MEG and M are different factors (10Meg against 10m)',
    text: '.MODEL FH-N4 NPN (IS=10f BF=100 VAF=10 RBM=10Meg IRB=10m)',
    cards: [{ name: 'FH-N4', line: 1, lastLine: 1, parameters: { IS: 10e-15, BF: 100, VAF: 10, RBM: 10e6, IRB: 10e-3 } }],
  },
  {
    when: 'comments of every kind around and inside the card',
    text: [
      '* Fernhollow Instruments parts bin',
      '   * an indented comment line',
      '',
      '.model FH-N5 NPN ( ; the parameters follow',
      '* a comment between continuation lines',
      '+ IS=3.3f $ saturation current',
      '+ BF=180 // forward gain',
      '+ VAF=90 )',
    ].join('\n'),
    cards: [{ name: 'FH-N5', line: 4, lastLine: 8, parameters: { IS: 3.3e-15, BF: 180, VAF: 90 } }],
  },
  {
    when: 'several cards in one file, one continued without parentheses, then .end',
    text: [
      '.model FH-A NPN IS=1f BF=100 VAF=50',
      '.model FH-B NPN IS=2f',
      '+ BF=200 VAF=0',
      '.model FH-C NPN(IS=0.05p BF=300 VAF=0.1k)',
      '.end',
      '* trailing comment',
    ].join('\n'),
    cards: [
      { name: 'FH-A', line: 1, lastLine: 1, parameters: { IS: 1e-15, BF: 100, VAF: 50 } },
      { name: 'FH-B', line: 2, lastLine: 3, parameters: { IS: 2e-15, BF: 200, VAF: 0 } },
      { name: 'FH-C', line: 4, lastLine: 4, parameters: { IS: 0.05e-12, BF: 300, VAF: 0.1e3 } },
    ],
  },
  {
    when: 'VA is VAF under its other name, and LEVEL=1 is the Gummel-Poon model',
    text: '.model 2FH7 NPN (LEVEL=1 IS=5f BF=120 VA=66)',
    cards: [{ name: '2FH7', line: 1, lastLine: 1, parameters: { LEVEL: 1, IS: 5e-15, BF: 120, VAF: 66 } }],
  },
  {
    when: 'CR-only line ends and a byte-order mark',
    text: '\ufeff* old file\r.model FH-CR NPN IS=1f BF=99 VAF=20\r',
    cards: [{ name: 'FH-CR', line: 2, lastLine: 2, parameters: { IS: 1e-15, BF: 99, VAF: 20 } }],
  },
];

describe('readModelFile: cards it accepts', () => {
  test.each(GOOD.map((c) => [c.when, c] as const))('when %s, then every card and value is read as written', (_when, { text, cards }) => {
    const result = readModelFile(bytes(text));
    expect(result).toEqual({ ok: true, cards: cards.map((card) => expect.objectContaining(card)) });
  });

  test('when a card is read, then its text is its own lines as written (comment lines between them left out)', () => {
    const result = readModelFile(bytes(GOOD[4].text));
    expect(result.ok && result.cards[0].text).toBe(['.model FH-N5 NPN ( ; the parameters follow', '+ IS=3.3f $ saturation current', '+ BF=180 // forward gain', '+ VAF=90 )'].join('\n'));
  });

  test('when the parameters keep their order, then the card device takes IS, BF and VAF from them, and its model every Gummel-Poon parameter', () => {
    // The model's names are the contract's list (ENGINE-CONTRACT "The full bipolar model"); ITF is ngspice's and not among them.
    expect(cardDevice({ IS: 1.2e-15, BF: 150, VAF: 86, NF: 1, CJE: 18e-12, RB: 25, ITF: 0.3 })).toEqual({
      family: 'npn',
      saturationCurrentA: 1.2e-15,
      beta: 150,
      earlyVoltageV: 86,
      model: { IS: 1.2e-15, BF: 150, VAF: 86, NF: 1, CJE: 18e-12, RB: 25 },
    });
  });

  test("when a card uses ngspice's other names (PE, ME, PC, MC, CCS, PS, MS, IK, VB), then they are read as VJE, MJE, VJC, MJC, CJS, VJS, MJS, IKF, VAR", () => {
    // Aliases as ngspice's BJT model table lists them (src/spicelib/devices/bjt/bjt.c, BJTmPTable).
    const result = parseModelCards('.model FH-A1 NPN (IS=5f BF=120 VAF=70 PE=0.7 ME=0.35 PC=0.6 MC=0.4 CCS=2p PS=0.55 MS=0.3 IK=50m VB=12)');
    expect(result.ok && result.cards[0].parameters).toEqual({
      IS: 5e-15, BF: 120, VAF: 70, VJE: 0.7, MJE: 0.35, VJC: 0.6, MJC: 0.4, CJS: 2e-12, VJS: 0.55, MJS: 0.3, IKF: 0.05, VAR: 12,
    });
  });
});

interface BadCase {
  when: string;
  text: string;
  line: number | undefined;
  message: RegExp;
}

const CARD = '.model FH-OK NPN (IS=5f BF=200 VAF=70)';

const BAD: BadCase[] = [
  { when: 'VAF is missing', text: `${CARD}\n.model FH-X NPN IS=1f BF=100`, line: 2, message: /FH-X: VAF is missing/ },
  { when: 'IS is missing', text: '.model FH-X NPN BF=100 VAF=5', line: 1, message: /FH-X: IS is missing/ },
  { when: 'BF is missing (reported at the .model line)', text: '* c\n.model FH-X NPN\n+ IS=1f\n+ VAF=5', line: 2, message: /FH-X: BF is missing/ },
  { when: 'a "(" is never closed', text: `${CARD}\n.model FH-X NPN (IS=1f BF=100\n+ VAF=5\n${CARD.replace('FH-OK', 'FH-Y')}`, line: 2, message: /unbalanced parentheses: the "\(" on line 2 is never closed \(the card ends on line 3\)/ },
  { when: 'a ")" has no "("', text: '.model FH-X NPN IS=1f BF=100\n+ VAF=5)', line: 2, message: /unbalanced parentheses: "\)" without a "\("/ },
  { when: 'parentheses are nested', text: '.model FH-X NPN (IS=1f (BF=100) VAF=5)', line: 1, message: /unbalanced parentheses: a "\(" inside/ },
  { when: 'text follows the closing parenthesis', text: '.model FH-X NPN (IS=1f BF=100 VAF=5) RB=3', line: 1, message: /after the closing parenthesis/ },
  { when: 'the card is PNP', text: `${CARD}\n.model FH-P PNP (IS=1f BF=100 VAF=5)`, line: 2, message: /PNP models are not supported/ },
  { when: 'the card is a MOSFET', text: '.model FH-M NMOS (VTO=0.7)', line: 1, message: /"NMOS" models are not supported/ },
  { when: 'the card has no type', text: '.model FH-X', line: 1, message: /names no device type/ },
  { when: 'the card has no name', text: '.model', line: 1, message: /no model name/ },
  { when: 'LEVEL selects another model', text: '.model FH-V NPN (LEVEL=4 IS=1f BF=100 VAF=5)', line: 1, message: /LEVEL=4 selects another transistor model/ },
  { when: 'a subcircuit holds the card', text: `* lib\n.subckt FHQ c b e\nQ1 c b e FH-OK\n${CARD}\n.ends`, line: 2, message: /Subcircuits/ },
  { when: 'a file is included', text: `${CARD}\n.include other.lib`, line: 2, message: /\.include is not supported/ },
  { when: 'a library section is referenced', text: `.lib parts.lib typical\n${CARD}`, line: 1, message: /\.lib is not supported/ },
  { when: 'a .param card gives a value', text: `.param bfv=150\n${CARD}`, line: 1, message: /\.param is not supported/ },
  { when: 'a value is an expression in braces', text: `${CARD}\n.model FH-E NPN (IS=1f\n+ BF={bfv} VAF=5)`, line: 3, message: /braces/ },
  { when: 'a value is quoted', text: ".model FH-Q NPN (IS=1f BF='150*1.1' VAF=5)", line: 1, message: /Quoted/ },
  { when: 'an unknown dot-card appears', text: `${CARD}\n.tran 1n 1u`, line: 2, message: /Unknown card "\.tran"/ },
  { when: 'a circuit element line appears', text: `${CARD}\nQ1 c b e FH-OK`, line: 2, message: /"Q1" looks like a circuit element line/ },
  { when: 'a + line has no card before it', text: '* c\n+ IS=1f', line: 2, message: /continuation line \(\+\) with no \.model card/ },
  { when: 'a value is not a SPICE3 number', text: '.model FH-X NPN (IS=1f BF=1k5 VAF=5)', line: 1, message: /BF=1k5 is not a SPICE number/ },
  { when: 'a parameter has no value', text: '.model FH-X NPN (IS=1f BF VAF=5)', line: 1, message: /BF has no value: write BF=value/ },
  { when: 'a parameter is given twice', text: '.model FH-X NPN (IS=1f BF=100\n+ VAF=5 bf=120)', line: 2, message: /BF is given twice \(first on line 1\)/ },
  { when: 'VAF is given twice under both names', text: '.model FH-X NPN (IS=1f BF=100 VAF=5 VA=6)', line: 1, message: /VAF is given twice/ },
  { when: 'two cards share a name, in another case', text: `${CARD}\n.model fh-ok NPN (IS=1f BF=100 VAF=5)`, line: 2, message: /second card of this name \(the first is on line 1\)/ },
  { when: 'IS is beyond the spec schema’s limit', text: '.model FH-X NPN (IS=1u BF=100 VAF=5)', line: 1, message: /IS=0\.000001 A is outside/ },
  { when: 'BF is below the spec schema’s limit', text: '.model FH-X NPN (IS=1f BF=5 VAF=5)', line: 1, message: /BF=5 is outside/ },
  { when: 'VAF is between 0 and 1 V', text: '.model FH-X NPN (IS=1f BF=100\n+ VAF=500m)', line: 2, message: /VAF=0\.5 V is outside/ },
  { when: 'something follows .end', text: `${CARD}\n.end\n${CARD.replace('FH-OK', 'FH-Z')}`, line: 3, message: /Nothing may follow \.end/ },
  { when: 'the model name has a character SPICE netlists would split on', text: '.model FH/X NPN (IS=1f BF=100 VAF=5)', line: 1, message: /Model name "FH\/X"/ },
  { when: 'a control character sits in a card', text: `.model FH-X NPN (IS=1f\u0007 BF=100 VAF=5)\n* ${'a long comment '.repeat(10)}`, line: 1, message: /control character \(U\+0007\)/ },
  { when: 'the file holds no card', text: '* only a comment\n\n', line: undefined, message: /no \.model card/ },
];

describe('readModelFile: inputs it refuses', () => {
  test.each(BAD.map((c) => [c.when, c] as const))('when %s, then refused naming the line and the reason', (_when, { text, line, message }) => {
    const result = readModelFile(bytes(text));
    expect(result.ok).toBe(false);
    const problems = result.ok ? [] : result.problems;
    const match = problems.find((p) => message.test(p.message));
    expect(match, JSON.stringify(problems)).toBeDefined();
    expect(match?.line).toBe(line);
  });

  test('when a file has good cards and one bad one, then no card is returned (all or nothing)', () => {
    const result = readModelFile(bytes(`${CARD}\n.model FH-2 NPN (IS=1f BF=100 VAF=5)\n.model FH-3 PNP (IS=1f)`));
    expect(result).toEqual({ ok: false, problems: [{ line: 3, message: expect.stringMatching(/PNP/) }] });
  });

  test('when a subcircuit is refused, then its inner lines are not reported again', () => {
    const result = parseModelCards(`.subckt FHQ c b e\nQ1 c b e FH-OK\nR1 b e 10k\n.ends\n${CARD}`);
    expect(result).toEqual({ ok: false, problems: [{ line: 1, message: expect.stringMatching(/Subcircuits/) }] });
  });

  test('when a file has more problems than are listed, then 50 are listed and the rest counted', () => {
    const result = parseModelCards(Array.from({ length: 60 }, (_, i) => `R${i} a b 1k`).join('\n'));
    expect(result.ok).toBe(false);
    const problems = result.ok ? [] : result.problems;
    expect(problems).toHaveLength(51);
    expect(problems[49].line).toBe(50);
    expect(problems[50]).toEqual({ message: '…and 10 more problems not listed.' });
  });

  test('when a file holds 201 cards, then it is refused at the 201st', () => {
    const text = Array.from({ length: 201 }, (_, i) => `.model FH-${i} NPN IS=1f BF=100 VAF=5`).join('\n');
    const result = parseModelCards(text);
    expect(result).toEqual({ ok: false, problems: [{ line: 201, message: expect.stringMatching(/More than 200 \.model cards/) }] });
  });
});

describe('decodeModelFile: text by content, not by name', () => {
  test('when a file is exactly at the limit, then it is read; one byte over, refused', () => {
    const card = `${CARD}\n`;
    const padding = '*'.repeat(MODEL_FILE_MAX_BYTES - card.length - 1);
    expect(decodeModelFile(bytes(`${card}${padding}\n`)).ok).toBe(true);
    expect(decodeModelFile(bytes(`${card}${padding}x\n`))).toEqual({ ok: false, problems: [{ message: expect.stringMatching(/at most 256 KB/) }] });
  });

  test.each([
    ['a NUL byte on line 2', new Uint8Array([...bytes(`${CARD}\n* x`), 0, 0x0a]), 2, /NUL bytes/],
    ['a lone continuation byte on line 3', new Uint8Array([...bytes('*\n*\n* '), 0x80, 0x0a]), 3, /not valid UTF-8/],
    ['an overlong encoding of "/"', new Uint8Array([...bytes('* '), 0xc0, 0xaf]), 1, /not valid UTF-8/],
    ['an encoded surrogate half', new Uint8Array([...bytes('* '), 0xed, 0xa0, 0x80]), 1, /not valid UTF-8/],
    ['a truncated three-byte character at the end', new Uint8Array([...bytes('* \u00e9 '), 0xe2, 0x82]), 1, /not valid UTF-8/],
    ['one character in ten a control character', bytes(`${CARD}\n${'*\u0002abcdefgh\n'.repeat(30)}`), 2, /control characters.*looks binary/],
    // Lines end at CR too, as the card reader numbers them (a file saved with classic Mac line ends).
    ['a NUL byte on line 3 of a file with CR line ends', new Uint8Array([...bytes(`${CARD}\r* x\r* y`), 0]), 3, /NUL bytes/],
  ] as const)('when the bytes hold %s, then refused at that line', (_what, input, line, message) => {
    const result = decodeModelFile(input);
    expect(result).toEqual({ ok: false, problems: [{ line, message: expect.stringMatching(message) }] });
  });

  test('when text is UTF-8 with accents in comments, then it is read', () => {
    const result = readModelFile(bytes(`* Fernhollow — Übersicht, µA\n${CARD}`));
    expect(result.ok).toBe(true);
  });

  test('when a 256 KB file is built to make a backtracking reader slow, then it is read in well under a second', () => {
    const hostile = [
      `.model FH-X NPN (${'('.repeat(1000)}`,
      ...Array.from({ length: 20000 }, () => '+ ====== 1e1e1e1e'),
      `${'1'.repeat(190)}x`,
    ].join('\n');
    const started = performance.now();
    const result = parseModelCards(hostile.slice(0, MODEL_FILE_MAX_BYTES));
    expect(performance.now() - started).toBeLessThan(1000);
    expect(result.ok).toBe(false);
  });
});

describe('what a card means to the engine', () => {
  test('when the card has parameters SPICE reads and the engine does not model, TNOM ≠ 27 and a name SPICE does not know, then the notes list each', () => {
    const notes = cardNotes({ IS: 1e-15, BF: 100, VAF: 50, BR: 4, TNOM: 25, NF: 1.01, ITF: 0.2, XTF: 3, FOO: 1 });
    expect(notes).toHaveLength(3);
    expect(notes[0]).toMatch(/does not model the card's TNOM, ITF, XTF; they are written into every netlist and simulated in the SPICE check/);
    expect(notes[1]).toMatch(/TNOM = 25 °C/);
    expect(notes[2]).toMatch(/^FOO is not a parameter of SPICE's bipolar model/);
  });

  test('when every parameter of the card is a Gummel-Poon parameter the engine models, then there is nothing to note', () => {
    expect(cardNotes({ IS: 1e-15, BF: 100, VAF: 50, BR: 4, NF: 1.01, CJE: 18e-12, CJC: 6e-12, CJS: 1e-12, RB: 25, TF: 0.4e-9 })).toEqual([]);
  });

  test("when a Gummel-Poon parameter lies outside the spec schema's device.model bounds, then the card is refused naming it and its line", () => {
    // MJE is a grading exponent: a junction's is between 1/3 (graded) and 1/2 (abrupt); 5 is a slip, as is a negative RB.
    const result = parseModelCards(['.model FH-B1 NPN (IS=5f BF=120 VAF=70', '+ MJE=5 RB=-10)'].join('\n'));
    expect(result.ok).toBe(false);
    const problems = result.ok ? [] : result.problems;
    expect(problems).toEqual([
      { line: 2, message: expect.stringMatching(/^FH-B1: RB=-10 is outside what a spec's device model accepts/) },
      { line: 2, message: expect.stringMatching(/^FH-B1: MJE=5 is outside/) },
    ]);
  });

  test('when a SPICE-only parameter changes only the charges, then it moves figures at a frequency and not the operating point', () => {
    // ngspice bjtload.c: XTF, VTF, ITF shape the transit time (charge only); TNOM and IBE enter the currents.
    expect(spiceOnlyParameterMoves('XTF', 'ac')).toBe(true);
    expect(spiceOnlyParameterMoves('XTF', 'dc')).toBe(false);
    expect(spiceOnlyParameterMoves('TNOM', 'dc')).toBe(true);
    expect(spiceOnlyParameterMoves('VBE_MAX', 'ac')).toBe(false);
    expect(spiceOnlyParameterMoves('CJE', 'ac')).toBe(false);
    expect(cardSpiceOnlyParameters({ IS: 1e-15, BF: 100, VAF: 50, TNOM: 25, CJE: 1e-12, FOO: 1, ITF: 0.2 })).toEqual({ TNOM: 25, ITF: 0.2 });
  });

  test('when the card is written into a netlist, then every line of it is a comment', () => {
    const texts = cardCommentLines({ name: 'FH-N2', fileName: 'bin.lib', checksum: 'ab'.repeat(32), text: '.model FH-N2 NPN (IS=1.2f\n+ BF=150 VAF=74.5)' });
    const lines = texts.flatMap((text) => commentLines(text, '* '));
    expect(lines.every((line) => line.startsWith('* '))).toBe(true);
    expect(lines).toContain('*   .model FH-N2 NPN (IS=1.2f');
    expect(lines).toContain('*   + BF=150 VAF=74.5)');
  });
});
