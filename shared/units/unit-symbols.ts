/**
 * Unit symbols the edges print and accept, as data: which spellings mean the same unit and
 * whether the unit takes an SI prefix. Units not listed are taken as written, with prefixes.
 */

/** How one unit is written. */
export interface UnitSymbol {
  /** Canonical symbol, as in the schema's `x-unit`. */
  symbol: string;
  /** Text printed after the number ("" for a pure number). */
  printed: string;
  /** Other spellings accepted when parsing. */
  aliases: readonly string[];
  /** Whether "k", "µ"... may precede it (not for dB, %, °C or ratios: common practice). */
  takesPrefix: boolean;
  /**
   * Spellings of the same unit with a prefixed denominator, each with the power of ten it
   * multiplies the number by: "2 V/µs" is 2e6 V/s (slew rates are quoted per microsecond).
   */
  scaledSpellings?: readonly ScaledSpelling[];
}

/** A spelling such as "V/µs" and the power of ten it stands for against the SI unit (6). */
export interface ScaledSpelling {
  spelling: string;
  exponent: number;
}

/**
 * Units of the Longtail forms and reports [SI]; "1" is SI's unit of a dimensionless number. The
 * ohm is U+03A9 GREEK CAPITAL LETTER OMEGA, as Unicode recommends; U+2126 OHM SIGN (its canonical
 * equivalent, still produced by some keyboards and character maps) is accepted as an alias. A
 * temperature difference of 1 K is one of 1 °C, so "/K" reads as "/°C" [SI].
 */
export const UNIT_SYMBOLS: readonly UnitSymbol[] = [
  { symbol: 'V', printed: 'V', aliases: [], takesPrefix: true },
  { symbol: 'A', printed: 'A', aliases: [], takesPrefix: true },
  { symbol: 'Ω', printed: 'Ω', aliases: ['\u2126', 'ohm', 'ohms', 'Ohm', 'Ohms'], takesPrefix: true },
  { symbol: 'W', printed: 'W', aliases: [], takesPrefix: true },
  { symbol: 'Hz', printed: 'Hz', aliases: ['hz'], takesPrefix: true },
  { symbol: 'F', printed: 'F', aliases: [], takesPrefix: true },
  { symbol: 'S', printed: 'S', aliases: [], takesPrefix: true },
  { symbol: 's', printed: 's', aliases: [], takesPrefix: true },
  { symbol: 'eV', printed: 'eV', aliases: [], takesPrefix: true },
  { symbol: 'dB', printed: 'dB', aliases: ['db'], takesPrefix: false },
  { symbol: '%', printed: '%', aliases: [], takesPrefix: false },
  { symbol: '°C', printed: '°C', aliases: ['℃', 'degC'], takesPrefix: false },
  { symbol: 'V/V', printed: 'V/V', aliases: [], takesPrefix: false },
  { symbol: 'A/A', printed: 'A/A', aliases: [], takesPrefix: false },
  { symbol: 'V/√Hz', printed: 'V/√Hz', aliases: ['V/rtHz', 'V/sqrtHz', 'V/sqrt(Hz)', 'V/√(Hz)', 'V/Hz^0.5'], takesPrefix: true },
  { symbol: 'V/°C', printed: 'V/°C', aliases: ['V/℃', 'V/degC', 'V/C', 'V/K'], takesPrefix: true },
  {
    symbol: 'V/s',
    printed: 'V/s',
    aliases: [],
    takesPrefix: true,
    scaledSpellings: [
      { spelling: 'V/ms', exponent: 3 },
      { spelling: 'V/µs', exponent: 6 },
      { spelling: 'V/μs', exponent: 6 },
      { spelling: 'V/us', exponent: 6 },
      { spelling: 'V/ns', exponent: 9 },
    ],
  },
  { symbol: 'ppm/°C', printed: 'ppm/°C', aliases: ['ppm/℃', 'ppm/degC', 'ppm/C', 'ppm/K'], takesPrefix: false },
  { symbol: '1', printed: '', aliases: [], takesPrefix: false },
];

/** The unit a symbol or alias names; an unlisted one is its own symbol and takes prefixes. */
export function unitSymbolFor(unit: string): UnitSymbol {
  const known = UNIT_SYMBOLS.find((u) => u.symbol === unit || u.aliases.includes(unit));
  return known ?? { symbol: unit, printed: unit, aliases: [], takesPrefix: true };
}

/** Whether typed text (trimmed) spells the unit. */
export function spellsUnit(text: string, unit: UnitSymbol): boolean {
  return text === unit.symbol || text === unit.printed || unit.aliases.includes(text);
}

/**
 * Whether typed text spells the unit in any letter case ("pf" for pF's F, "mw" for mW's W, "OHM"):
 * used only where the case cannot change the meaning, that is after a prefix or when the text is
 * no prefix on its own (a lone "f" in a farad field stays femto).
 */
export function spellsUnitIgnoringCase(text: string, unit: UnitSymbol): boolean {
  const lower = text.toLowerCase();
  return [unit.symbol, unit.printed, ...unit.aliases].some((spelling) => spelling !== '' && spelling.toLowerCase() === lower);
}
