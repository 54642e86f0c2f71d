/**
 * The one "is this upload really text" check (shared/text/upload-text.ts), behind the library
 * file, measurement CSV and spec import uploads.
 *
 * UTF-8 validity follows RFC 3629, section 3 (the UTF8-octets grammar): no C0/C1 lead bytes, no
 * overlong forms (E0 needs A0..BF after it, F0 needs 90..BF), no surrogates (ED needs 80..9F),
 * nothing above U+10FFFF (F4 needs 80..8F, F5..FF never appear), no truncated sequence; the
 * same bytes the WHATWG Encoding Standard's fatal UTF-8 decoder refuses. Control characters are
 * Unicode's Cc category (U+0000–U+001F, U+007F–U+009F); the ones a text file may hold are tab,
 * line feed, form feed and carriage return.
 */
import { describe, expect, test } from 'vitest';
import { BINARY_CONTROL_SHARE, decodeUploadText, isStrayControl } from '#shared/text/upload-text';

const bytes = (text: string) => new TextEncoder().encode(text);
const fatalDecoderRefuses = (input: Uint8Array) => {
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(input);
    return false;
  } catch {
    return true;
  }
};

describe('decodeUploadText: bytes that are text', () => {
  test('UTF-8 with accents is read as written; a byte order mark is dropped', () => {
    expect(decodeUploadText(bytes('\uFEFFÜbersicht, 4,7 µA\r\n'), { controls: 'refuse' })).toEqual({ ok: true, text: 'Übersicht, 4,7 µA\r\n' });
  });

  test('tab, line feed, form feed and carriage return are text; the other controls are not (Unicode Cc)', () => {
    for (const code of [0x09, 0x0a, 0x0c, 0x0d]) expect(isStrayControl(code)).toBe(false);
    for (const code of [0x00, 0x07, 0x0b, 0x1b, 0x1f, 0x7f, 0x85, 0x9f]) expect(isStrayControl(code)).toBe(true);
    for (const code of [0x20, 0x7e, 0xa0, 0xe9]) expect(isStrayControl(code)).toBe(false);
  });
});

describe('decodeUploadText: bytes that are not text, with the line they are on', () => {
  test('over the size limit: the sizes, before anything else is read', () => {
    expect(decodeUploadText(new Uint8Array(11), { maxBytes: 10, controls: 'keep' })).toEqual({ ok: false, problem: { kind: 'too-large', bytes: 11, maxBytes: 10 } });
    expect(decodeUploadText(new Uint8Array(10).fill(0x41), { maxBytes: 10, controls: 'keep' }).ok).toBe(true);
  });

  test('a NUL byte (binary, or UTF-16 text) is refused before the encoding is checked', () => {
    const utf16 = new Uint8Array([0xff, 0xfe, 0x61, 0x00]);
    expect(decodeUploadText(utf16, { controls: 'keep' })).toEqual({ ok: false, problem: { kind: 'nul', line: 1 } });
  });

  test.each([
    ['a lone continuation byte', [0x80]],
    ['a C0 lead byte (overlong two-byte form)', [0xc0, 0xaf]],
    ['an overlong three-byte form (E0 80..9F)', [0xe0, 0x80, 0xaf]],
    ['an encoded surrogate half (ED A0..BF)', [0xed, 0xa0, 0x80]],
    ['a code point above U+10FFFF (F4 90..)', [0xf4, 0x90, 0x80, 0x80]],
    ['an F5 lead byte', [0xf5, 0x80, 0x80, 0x80]],
    ['a truncated three-byte sequence', [0xe2, 0x82]],
    ['Latin-1 "é"', [0xe9, 0x0a]],
  ])('%s (RFC 3629) is not UTF-8, on its line, as the fatal decoder also says', (_name, tail) => {
    const input = new Uint8Array([...bytes('a\nb\n'), ...tail]);
    expect(fatalDecoderRefuses(input)).toBe(true);
    expect(decodeUploadText(input, { controls: 'keep' })).toEqual({ ok: false, problem: { kind: 'not-utf8', line: 3 } });
  });

  test('lines end at CR LF, LF or CR, as the file readers count them (a classic Mac file counts its lines too)', () => {
    expect(decodeUploadText(new Uint8Array([...bytes('a\rb\r\nc\r'), 0]), { controls: 'keep' })).toEqual({ ok: false, problem: { kind: 'nul', line: 4 } });
    expect(decodeUploadText(new Uint8Array([...bytes('a\rb\r'), 0x80]), { controls: 'keep' })).toEqual({ ok: false, problem: { kind: 'not-utf8', line: 3 } });
  });

  test('refuse: one stray control refuses the file, naming it and its line', () => {
    expect(decodeUploadText(bytes('a\r\nb\u0007\n'), { controls: 'refuse' })).toEqual({ ok: false, problem: { kind: 'control', line: 2, code: 7, count: 1, length: 6 } });
    expect(decodeUploadText(bytes('a\u000bb'), { controls: 'refuse' })).toMatchObject({ ok: false, problem: { kind: 'control', code: 0x0b } });
  });

  test(`refuse-binary: more than ${BINARY_CONTROL_SHARE * 100} % stray controls refuse the file; fewer are left to the reader`, () => {
    const few = `\u0002${'a'.repeat(99)}`; // 1 in 100: not more than 1 %
    expect(decodeUploadText(bytes(few), { controls: 'refuse-binary' })).toEqual({ ok: true, text: few });
    const many = `${'a'.repeat(98)}\n\u0002\u0002`; // 2 in 101
    expect(decodeUploadText(bytes(many), { controls: 'refuse-binary' })).toEqual({ ok: false, problem: { kind: 'control', line: 2, code: 2, count: 2, length: 101 } });
  });

  test('keep: controls are left to the reader', () => {
    expect(decodeUploadText(bytes('a\u0007b'), { controls: 'keep' })).toEqual({ ok: true, text: 'a\u0007b' });
  });
});
