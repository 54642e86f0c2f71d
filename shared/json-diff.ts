/**
 * Differences between two JSON documents (two spec versions), field by field, with JSON-pointer
 * paths: what the version history shows. Pure.
 */
export interface JsonChange {
  path: string;
  kind: 'added' | 'removed' | 'changed';
  before?: unknown;
  after?: unknown;
}

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const segment = (key: string | number) => String(key).replace(/~/g, '~0').replace(/\//g, '~1');

/** Every leaf that differs between `before` and `after` (arrays compared element by element). */
export function diffJson(before: unknown, after: unknown, path = ''): JsonChange[] {
  if (isObject(before) && isObject(after)) {
    const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])].sort();
    return keys.flatMap((key) => {
      const child = `${path}/${segment(key)}`;
      if (!(key in after)) return [{ path: child, kind: 'removed' as const, before: before[key] }];
      if (!(key in before)) return [{ path: child, kind: 'added' as const, after: after[key] }];
      return diffJson(before[key], after[key], child);
    });
  }
  if (Array.isArray(before) && Array.isArray(after)) {
    const length = Math.max(before.length, after.length);
    return Array.from({ length }, (_, i) => {
      const child = `${path}/${i}`;
      if (i >= after.length) return [{ path: child, kind: 'removed' as const, before: before[i] }];
      if (i >= before.length) return [{ path: child, kind: 'added' as const, after: after[i] }];
      return diffJson(before[i], after[i], child);
    }).flat();
  }
  return Object.is(before, after) ? [] : [{ path: path || '/', kind: 'changed', before, after }];
}
