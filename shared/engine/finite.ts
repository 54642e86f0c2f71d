/**
 * Guard against NaN and Infinity leaving the engine: JSON would turn them into null silently.
 * Returns the JSON path of the first non-finite number, or null when every number is finite.
 * The walk builds no path until it finds one (it runs over every option's whole answer).
 */
export function firstNonFinitePath(value: unknown, path = ''): string | null {
  const keys = nonFiniteKeys(value);
  if (keys === null) return null;
  let found = path;
  for (let i = keys.length - 1; i >= 0; i -= 1) found += `/${keys[i]}`;
  return found || '/';
}

/** The keys down to the first non-finite number, innermost first; null when there is none. */
function nonFiniteKeys(value: unknown): string[] | null {
  if (typeof value === 'number') return Number.isFinite(value) ? null : [];
  if (value && typeof value === 'object') {
    // an array's entries are its indices in order, so arrays and objects take one path
    if (Array.isArray(value)) {
      for (let i = 0; i < value.length; i += 1) {
        if (!(i in value)) continue;
        const found = nonFiniteKeys(value[i]);
        if (found) {
          found.push(String(i));
          return found;
        }
      }
      return null;
    }
    for (const key of Object.keys(value)) {
      const found = nonFiniteKeys((value as Record<string, unknown>)[key]);
      if (found) {
        found.push(key);
        return found;
      }
    }
  }
  return null;
}
