/**
 * The published sources behind the engine's formulas and constants, as data: the citation keys
 * the code writes in brackets ("[GM]", "[SPICE]"), each with the work as the project's domain
 * notes cite it and what the engine takes from it. Reports print this list; the server may too.
 *
 * Razavi's MOS text is in the domain notes for MOS variants, which the engine does not have yet,
 * so it is not listed: a source appears here only when the engine uses it.
 */

export interface EngineSource {
  /** The bracketed key the code cites: "GM" for "[GM]". */
  key: string;
  /** Author(s) or issuing body. */
  author: string;
  /** Title of the work. */
  title: string;
  /** Edition, year or part, as cited (empty when the notes name none). */
  edition: string;
  /** The whole citation as one line. */
  citation: string;
  /** What the engine takes from it. */
  usedFor: string;
}

/** "Author, Title (edition)", or the given citation where the notes write it another way. */
function source(key: string, author: string, title: string, edition: string, usedFor: string, citation = `${author}, ${title}${edition ? ` (${edition})` : ''}`): EngineSource {
  return { key, author, title, edition, citation, usedFor };
}

/** Every published source the engine cites, in the order the domain notes list them. */
export const ENGINE_SOURCES: readonly EngineSource[] = [
  source('SI', 'BIPM', 'The International System of Units', 'SI Brochure, 9th ed., 2019', 'The exact Boltzmann constant k and elementary charge q, and so the thermal voltage VT = kT/q.'),
  source(
    'GM',
    'Gray, Hurst, Lewis, Meyer',
    'Analysis and Design of Analog Integrated Circuits',
    'ch. 3-4',
    'Small-signal gm, rπ and ro; the current mirrors and their output resistance (simple, degenerated, Widlar, Wilson, cascode), quoted as textbook limits beside the solved figures.',
  ),
  source('SS', 'Sedra, Smith', 'Microelectronic Circuits', 'differential-pair chapter', 'Differential and common-mode gain of the pair, CMRR and its limit from load and transconductance mismatch, emitter degeneration.'),
  source(
    'SPICE',
    'ngspice',
    'the ngspice user manual',
    'bipolar (Gummel-Poon) model and its temperature equations',
    'The device model the engine solves (IS, BF, VAF with the Early effect on VCB), the IS temperature law, GMIN, junction limiting, TNOM, and the netlist conventions.',
    'the ngspice user manual, bipolar (Gummel-Poon) model and its temperature equations',
  ),
  source(
    'IEC60063',
    'IEC',
    'IEC 60063:2015, preferred number series for resistors and capacitors',
    'E-series',
    'The E24, E96 and E192 values every sized resistor is snapped to.',
    'IEC 60063:2015, preferred number series for resistors and capacitors (E-series)',
  ),
  source(
    'IEC62368',
    'IEC',
    'IEC 62368-1 energy-source classes',
    '60 V DC as the usual safe-to-touch limit',
    'The rail-voltage caution.',
    'IEC 62368-1 energy-source classes (60 V DC as the usual safe-to-touch limit)',
  ),
];

/** The source a bracketed key names, if the engine cites it. */
export function engineSource(key: string): EngineSource | undefined {
  return ENGINE_SOURCES.find((s) => s.key === key);
}
