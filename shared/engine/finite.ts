/**
 * Guard against NaN and Infinity leaving the engine: JSON would turn them into null silently.
 * Returns the JSON path of the first non-finite number, or null when every number is finite.
 */
export function firstNonFinitePath(value: unknown, path = ''): string | null {
  if (typeof value === 'number') return Number.isFinite(value) ? null : path || '/';
  // an array's entries are its indices in order, so arrays and objects take one path
  if (value && typeof value === 'object') {
    for (const [key, child] of Object.entries(value)) {
      const found = firstNonFinitePath(child, `${path}/${key}`);
      if (found) return found;
    }
  }
  return null;
}
