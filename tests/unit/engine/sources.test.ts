/**
 * The sources list the reports print (shared/engine/sources.ts) against the citations the code
 * itself writes: every bracketed key in a comment of shared/ or rules/ ("[GM]", "[SPICE]") must be
 * in the list, and every listed source must be cited somewhere, so the printed list is neither
 * short of a source nor padded with one the engine does not use.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { ENGINE_SOURCES, engineSource } from '#shared/engine/sources';

const root = join(import.meta.dirname, '..', '..', '..');

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return files(path);
    return /\.(ts|json)$/.test(name) && name !== 'sources.ts' ? [path] : [];
  });
}

/** Bracketed upper-case keys inside comments (a line's text after `//` or `/*`, or a block-comment line starting with `*`). */
function citedKeys(text: string): string[] {
  const keys: string[] = [];
  for (const line of text.split('\n')) {
    const trimmed = line.trimStart();
    const starts = [line.indexOf('//'), line.indexOf('/*')].filter((i) => i >= 0);
    const from = trimmed.startsWith('*') ? 0 : starts.length > 0 ? Math.min(...starts) : -1;
    if (from < 0) continue;
    for (const match of line.slice(from).matchAll(/\[([A-Z][A-Z0-9]+)\]/g)) keys.push(match[1]);
  }
  return keys;
}

const cited = new Set([...files(join(root, 'shared')), ...files(join(root, 'rules'))].flatMap((path) => citedKeys(readFileSync(path, 'utf8'))));

describe('engine sources', () => {
  test('the code cites the sources the domain notes name (a sanity check of the scan itself)', () => {
    for (const key of ['SI', 'GM', 'SS', 'SPICE']) expect(cited.has(key), key).toBe(true);
  });

  test('every key the code cites is in the printed list', () => {
    const missing = [...cited].filter((key) => !engineSource(key));
    expect(missing).toEqual([]);
  });

  test('every listed source is cited somewhere in the code', () => {
    const unused = ENGINE_SOURCES.map((s) => s.key).filter((key) => !cited.has(key));
    expect(unused).toEqual([]);
  });

  test('each entry names its author and title, and its citation line carries both', () => {
    expect(new Set(ENGINE_SOURCES.map((s) => s.key)).size).toBe(ENGINE_SOURCES.length);
    for (const source of ENGINE_SOURCES) {
      expect(source.author.length, source.key).toBeGreaterThan(0);
      expect(source.title.length, source.key).toBeGreaterThan(0);
      expect(source.citation, source.key).toContain(source.title.replace(/^the /, ''));
      expect(source.usedFor.length, source.key).toBeGreaterThan(10);
    }
  });
});
