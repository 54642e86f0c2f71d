/**
 * SI decimal prefixes used at the edges (forms, reports), femto to tera [SI]. Data, not
 * branches: parsing and formatting both read this one table.
 */

/** One SI prefix: the symbol printed, the spellings accepted when parsing, and its power of ten. */
export interface SiPrefix {
  /** Printed symbol ("µ" is U+00B5 MICRO SIGN). */
  symbol: string;
  name: string;
  /** Power of ten the prefix stands for. */
  exponent: number;
  /**
   * Other spellings accepted in forms: "u" and Greek "μ" for micro (ASCII habit), "K" for kilo
   * (common practice).
   */
  aliases: readonly string[];
  /** Spellings accepted in any case: "meg" for mega, as SPICE writes it ("1meg", "1MEG", "1Meg"). */
  anyCaseAliases?: readonly string[];
}

/** The prefixes from femto to tera, smallest first [SI]. */
export const SI_PREFIXES: readonly SiPrefix[] = [
  { symbol: 'f', name: 'femto', exponent: -15, aliases: [] },
  { symbol: 'p', name: 'pico', exponent: -12, aliases: [] },
  { symbol: 'n', name: 'nano', exponent: -9, aliases: [] },
  { symbol: 'µ', name: 'micro', exponent: -6, aliases: ['u', 'μ'] },
  { symbol: 'm', name: 'milli', exponent: -3, aliases: [] },
  { symbol: 'k', name: 'kilo', exponent: 3, aliases: ['K'] },
  { symbol: 'M', name: 'mega', exponent: 6, aliases: [], anyCaseAliases: ['meg'] },
  { symbol: 'G', name: 'giga', exponent: 9, aliases: [] },
  { symbol: 'T', name: 'tera', exponent: 12, aliases: [] },
];

/** The prefix printed for a power of ten that is a multiple of 3 in range, else undefined. */
export function prefixForExponent(exponent: number): SiPrefix | undefined {
  return SI_PREFIXES.find((prefix) => prefix.exponent === exponent);
}

/** One accepted spelling of a prefix; `anyCase` spellings match without regard to case. */
export interface PrefixSpelling {
  spelling: string;
  prefix: SiPrefix;
  anyCase: boolean;
}

/** Every accepted spelling with its prefix, longest first so "meg" wins over "m". */
export const PREFIX_SPELLINGS: readonly PrefixSpelling[] = SI_PREFIXES.flatMap((prefix) => [
  ...[prefix.symbol, ...prefix.aliases].map((spelling) => ({ spelling, prefix, anyCase: false })),
  ...(prefix.anyCaseAliases ?? []).map((spelling) => ({ spelling, prefix, anyCase: true })),
]).sort((a, b) => b.spelling.length - a.spelling.length);

/** Whether `text` starts with the spelling (in any case for "meg"; prefix letters themselves are case-sensitive: m is milli, M mega). */
export function startsWithSpelling(text: string, { spelling, anyCase }: PrefixSpelling): boolean {
  return anyCase ? text.slice(0, spelling.length).toLowerCase() === spelling : text.startsWith(spelling);
}
