/**
 * The one check that an uploaded file is really text, by its content (never by its name or
 * the type the browser claims), for every upload: library files of `.model` cards
 * (`shared/devices/model-card.ts`), bench measurement CSVs (`shared/measurements/measurement-csv.ts`)
 * and spec import files (`api/services/spec-import.service.ts`).
 *
 * In this order: not over the size limit; no NUL byte (a binary or UTF-16 file); valid UTF-8
 * (RFC 3629: no overlong forms, no surrogates, nothing above U+10FFFF, no truncated sequence); a
 * UTF-8 byte order mark dropped; then stray control characters, as the caller's `controls`
 * asks. Every problem names the line it is on, lines ending at CR LF, LF or CR as the file
 * readers count them. Each caller phrases the problem for its own kind of file.
 */

/** A control character no text file needs: C0 but tab, line feed, form feed and carriage return; DEL; C1. */
export function isStrayControl(code: number): boolean {
  if (code === 0x09 || code === 0x0a || code === 0x0c || code === 0x0d) return false;
  return code < 0x20 || (code >= 0x7f && code <= 0x9f);
}

/**
 * What to do with stray control characters once the bytes are UTF-8 text:
 * - `refuse`: any one refuses the file (a CSV has no place for one);
 * - `refuse-binary`: refused when more than `BINARY_CONTROL_SHARE` of the characters are (the
 *   file looks binary); fewer are left to the reader, which names the line;
 * - `keep`: left to the reader (its row checks refuse them in the fields they reach).
 */
export type ControlPolicy = 'refuse' | 'refuse-binary' | 'keep';

/** Above this share of stray control characters a file counts as binary (`refuse-binary`). */
export const BINARY_CONTROL_SHARE = 0.01;

export interface UploadTextOptions {
  /** Largest file, bytes; no limit when absent (the upload middleware holds one). */
  maxBytes?: number;
  controls: ControlPolicy;
}

/** Why the bytes are not accepted as text; `line` is 1-based. */
export type UploadTextProblem =
  | { kind: 'too-large'; bytes: number; maxBytes: number }
  | { kind: 'nul'; line: number }
  | { kind: 'not-utf8'; line: number }
  /** `code` and `line`: the first stray control; `count` of `length` characters are stray controls. */
  | { kind: 'control'; line: number; code: number; count: number; length: number };

export type UploadTextResult = { ok: true; text: string } | { ok: false; problem: UploadTextProblem };

/** The file's text, or the first reason it is not text (see above). */
export function decodeUploadText(bytes: Uint8Array, options: UploadTextOptions): UploadTextResult {
  if (options.maxBytes !== undefined && bytes.length > options.maxBytes) {
    return { ok: false, problem: { kind: 'too-large', bytes: bytes.length, maxBytes: options.maxBytes } };
  }
  const nul = bytes.indexOf(0);
  if (nul >= 0) return { ok: false, problem: { kind: 'nul', line: lineOfByte(bytes, nul) } };
  const invalid = firstInvalidUtf8(bytes);
  if (invalid >= 0) return { ok: false, problem: { kind: 'not-utf8', line: lineOfByte(bytes, invalid) } };
  let text = new TextDecoder('utf-8').decode(bytes);
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  if (options.controls === 'keep') return { ok: true, text };
  let count = 0;
  let first = -1;
  for (let i = 0; i < text.length; i += 1) {
    if (!isStrayControl(text.charCodeAt(i))) continue;
    if (options.controls === 'refuse') return { ok: false, problem: { kind: 'control', line: lineOfIndex(text, i), code: text.charCodeAt(i), count: 1, length: text.length } };
    count += 1;
    if (first < 0) first = i;
  }
  if (count > 0 && count > text.length * BINARY_CONTROL_SHARE) {
    return { ok: false, problem: { kind: 'control', line: lineOfIndex(text, first), code: text.charCodeAt(first), count, length: text.length } };
  }
  return { ok: true, text };
}

/** Index of the first byte that breaks UTF-8 (RFC 3629: no overlongs, no surrogates), or -1. */
function firstInvalidUtf8(bytes: Uint8Array): number {
  let i = 0;
  while (i < bytes.length) {
    const b = bytes[i];
    if (b < 0x80) {
      i += 1;
      continue;
    }
    let need: number;
    let low = 0x80;
    let high = 0xbf;
    if (b >= 0xc2 && b <= 0xdf) need = 1;
    else if (b >= 0xe0 && b <= 0xef) {
      need = 2;
      if (b === 0xe0) low = 0xa0;
      if (b === 0xed) high = 0x9f;
    } else if (b >= 0xf0 && b <= 0xf4) {
      need = 3;
      if (b === 0xf0) low = 0x90;
      if (b === 0xf4) high = 0x8f;
    } else return i;
    for (let k = 1; k <= need; k += 1) {
      const c = bytes[i + k];
      if (c === undefined) return i;
      if (k === 1 ? c < low || c > high : c < 0x80 || c > 0xbf) return i;
    }
    i += need + 1;
  }
  return -1;
}

/** Line (from 1) of a position, lines ending at CR LF, LF or CR; `at(i)` is the code unit or byte at i. */
function lineAt(index: number, at: (i: number) => number | undefined): number {
  let line = 1;
  for (let i = 0; i < index; i += 1) {
    const c = at(i);
    if (c === 0x0a || (c === 0x0d && at(i + 1) !== 0x0a)) line += 1;
  }
  return line;
}

function lineOfByte(bytes: Uint8Array, index: number): number {
  return lineAt(index, (i) => bytes[i]);
}

function lineOfIndex(text: string, index: number): number {
  return lineAt(index, (i) => (i < text.length ? text.charCodeAt(i) : undefined));
}
