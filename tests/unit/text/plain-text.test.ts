/**
 * User text kept as data: the characters refused and replaced are the C0 and C1 controls (ECMA-48
 * / ISO 6429), the Unicode line and paragraph separators, and the bidi embeddings, overrides and
 * isolates of Unicode Technical Report #36 (CVE-2021-42574, "Trojan Source"). The schema's text
 * fields carry the same patterns, and the mail texts are built through the same module.
 */
import { describe, expect, test } from 'vitest';
import { composeMessage } from '../../../api/mail/compose';
import { SPEC_SCHEMA, validateSpec } from '#shared/validate';
import {
  PLAIN_LINES_PATTERN,
  PLAIN_LINE_PATTERN,
  PLAIN_NAME_PATTERN,
  commentLines,
  firstUnsafeCharacter,
  singleLine,
  spreadsheetCell,
  spreadsheetSafeDelimited,
} from '#shared/text/plain-text';

/** Every code point the refusal covers, listed from the standards rather than from the module. */
const C0 = Array.from({ length: 0x20 }, (_, i) => i);
const C1_AND_DEL = Array.from({ length: 0xa0 - 0x7f }, (_, i) => 0x7f + i);
const SEPARATORS = [0x2028, 0x2029];
const BIDI = [0x202a, 0x202b, 0x202c, 0x202d, 0x202e, 0x2066, 0x2067, 0x2068, 0x2069];
const REFUSED = [...C0, ...C1_AND_DEL, ...SEPARATORS, ...BIDI];

describe('refused characters', () => {
  test.each(REFUSED.map((code) => [`U+${code.toString(16).toUpperCase().padStart(4, '0')}`, code]))('%s is refused in one line and blanked by singleLine', (_hex, code) => {
    const text = `Kestrel${String.fromCodePoint(code)}rev C`;
    expect(firstUnsafeCharacter(text)).toMatchObject({ position: 8 });
    expect(new RegExp(PLAIN_LINE_PATTERN, 'u').test(text)).toBe(false);
    expect(singleLine(text)).toBe('Kestrel rev C');
  });

  test.each([
    ['Ω-Brücke 2 µA — “fast”', true],
    ['北京 probe ✓', true],
    ['emoji 🔌 plug', true],
    ['zero\u200bwidth', true], // a zero-width space is not a control
  ])('%j is plain text', (text, plain) => {
    expect(firstUnsafeCharacter(text) === null).toBe(plain);
    expect(new RegExp(PLAIN_LINE_PATTERN, 'u').test(text)).toBe(plain);
  });

  test('multi-line text keeps LF and refuses CR, tab and the rest', () => {
    const lines = new RegExp(PLAIN_LINES_PATTERN, 'u');
    expect(lines.test('first line\nsecond line')).toBe(true);
    expect(lines.test('first line\r\nsecond line')).toBe(false);
    expect(lines.test('a\tb')).toBe(false);
    expect(lines.test('a\u202eb')).toBe(false);
    expect(firstUnsafeCharacter('ok\nok\u0085', true)).toEqual({ position: 6, name: 'U+0085 (next line)' });
  });

  test('a name must hold something besides blanks', () => {
    const name = new RegExp(PLAIN_NAME_PATTERN, 'u');
    expect(name.test('   ')).toBe(false);
    expect(name.test('  Kestrel ')).toBe(true);
    expect(name.test('Kestrel\n')).toBe(false);
  });
});

describe('comment lines', () => {
  test('every line of the text is one comment line, whatever the line break', () => {
    const lines = commentLines('a\nb\rc\r\nd\u000be\u000cf\u0085g\u2028h\u2029i', '* ');
    expect(lines).toEqual(['* a', '* b', '* c', '* d', '* e', '* f', '* g', '* h', '* i']);
  });

  test('a line starting with # stays behind the blank (ngspice runs *# lines)', () => {
    expect(commentLines('#shell id', '* ')).toEqual(['* #shell id']);
    expect(() => commentLines('x', '*')).toThrow(RangeError);
  });
});

describe('spreadsheet cells (OWASP CSV injection)', () => {
  test.each([
    ['=SUM(A1:A9)', "'=SUM(A1:A9)"],
    ['+12 V', "'+12 V"],
    ['@probe', "'@probe"],
    ['\t=1+1', ' =1+1'],
    ['two\r\nlines', 'two  lines'],
    ['Tarn probe', 'Tarn probe'],
  ])('%j is written %j', (text, written) => {
    expect(spreadsheetCell(text)).toBe(written);
  });
});

describe('delimited text opened in a spreadsheet', () => {
  test.each([
    ['frequency_hz,gain_db\n10,-3.5\n100,+2\n1k,-1e-1\n', 'frequency_hz,gain_db\n10,-3.5\n100,+2\n1k,-1e-1\n'],
    ['# note,=1+1', "# note,'=1+1"],
    ['# note;"=HYPERLINK(1)"', `# note;"'=HYPERLINK(1)"`],
    ['# a\t @x', "# a\t '@x"],
    ['\uFEFF=1+1,2', "\uFEFF'=1+1,2"],
    ['-2+3,-2', "'-2+3,-2"],
  ])('%j is written %j', (text, written) => {
    expect(spreadsheetSafeDelimited(text)).toBe(written);
  });
});

describe('the spec schema', () => {
  const properties = SPEC_SCHEMA.properties as Record<string, { pattern?: string; properties?: Record<string, { pattern?: string }> }>;
  test('the title and the device-model name carry the one-line pattern', () => {
    expect(properties.title.pattern).toBe(PLAIN_LINE_PATTERN);
    expect(properties.deviceModel.properties?.name.pattern).toBe(PLAIN_LINE_PATTERN);
  });

  test('a title with a line break is refused at /title with the character named', () => {
    const result = validateSpec({ title: 'Kestrel\n.control', supply: { positiveV: 12, negativeV: -12 }, gain: { target: 20 }, cmrr: { minDb: 60 } });
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.errors).toEqual([{ path: '/title', message: expect.stringMatching(/^must not contain U\+000A \(line feed\) \(character 8\)/) }]);
  });
});

describe('e-mail texts', () => {
  const facts = {
    kind: 'proposal.returned' as const,
    proposalId: 7,
    projectName: 'Kestrel\r\nBcc: someone@example.test',
    specTitle: 'Kestrel rev C\u2028.control',
    specVersion: 2,
    link: 'http://localhost/p/7',
    profileLink: 'http://localhost/me',
    reviewedBy: 'Rhea\u202eRoe',
    comment: 'first\nsecond\u000cthird',
    decision: { kind: 'accept' as const, topology: 'wilson', recommended: 'wilson', reason: null, decidedBy: 'Dov\nDale' },
  };

  test('the subject is one line and the body has no control characters besides LF', () => {
    const message = composeMessage(facts, 'Ann\rAsh', 'you wrote the spec');
    expect(message.subject).not.toMatch(/[\u0000-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]/u);
    // User text never reaches a header: the subject names the proposal and the version only; the title is in the body, on one line.
    expect(message.subject).toBe('Proposal #7 sent back for rework (spec version 2)');
    expect(message.text.split('\n')).toContain('Spec: "Kestrel rev C .control", version 2');
    expect(message.text).not.toMatch(/[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]/u);
    expect(message.text.split('\n')).toEqual(expect.arrayContaining(['Hello Ann Ash,', 'Project: Kestrel  Bcc: someone@example.test', '  first', '  second', '  third']));
    expect(message.text.split('\n').some((line) => line.startsWith('Bcc:'))).toBe(false);
  });
});
