/**
 * Each source the reports print (shared/engine/sources.ts) is cited the way the project's domain
 * notes cite it (DOMAIN.md, "Sources named below"; quoted here line by line), and looked up by
 * its bracketed key.
 */
import { expect, test } from 'vitest';
import { ENGINE_SOURCES, engineSource } from '#shared/engine/sources';

/** The domain notes' source lines, key and citation (the notes' trailing gloss left out). */
const DOMAIN_NOTES: Record<string, string> = {
  SI: 'BIPM, The International System of Units (SI Brochure, 9th ed., 2019)',
  GM: 'Gray, Hurst, Lewis, Meyer, Analysis and Design of Analog Integrated Circuits (ch. 3-4)',
  SS: 'Sedra, Smith, Microelectronic Circuits (differential-pair chapter)',
  SPICE: 'the ngspice user manual, bipolar (Gummel-Poon) model and its temperature equations',
  IEC60063: 'IEC 60063:2015, preferred number series for resistors and capacitors (E-series)',
  IEC62368: 'IEC 62368-1 energy-source classes (60 V DC as the usual safe-to-touch limit)',
};

test('the sources in the order the domain notes list them, each cited as they cite it', () => {
  expect(ENGINE_SOURCES.map((s) => s.key)).toEqual(Object.keys(DOMAIN_NOTES));
  for (const source of ENGINE_SOURCES) expect(source.citation, source.key).toBe(DOMAIN_NOTES[source.key]);
});

test('author and title are the citation\'s own parts', () => {
  for (const source of ENGINE_SOURCES) {
    expect(source.citation, source.key).toContain(source.author === 'ngspice' ? 'ngspice' : source.author);
    // every source the notes list names its edition or part, and the citation carries it
    expect(source.edition.length, source.key).toBeGreaterThan(0);
    expect(DOMAIN_NOTES[source.key], source.key).toContain(source.edition);
  }
  expect(engineSource('GM')).toMatchObject({ author: 'Gray, Hurst, Lewis, Meyer', title: 'Analysis and Design of Analog Integrated Circuits', edition: 'ch. 3-4' });
});

test('a key is looked up exactly; an unknown one gives nothing', () => {
  expect(engineSource('SPICE')!.key).toBe('SPICE');
  expect(engineSource('RZ')).toBeUndefined(); // in the notes for MOS variants, not used by the engine yet
  expect(engineSource('gm')).toBeUndefined();
});
