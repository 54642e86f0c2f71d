/**
 * The resistors of a sized design, named as the schematic names them: RC1/RC2 (collector loads),
 * RE1/RE2 (pair degeneration), RT (resistor tail), RREF (mirror reference), RE3/RE4 (mirror
 * emitters), RSU (start-up; the tail's names and roles are the catalogue's,
 * shared/engine/topologies.ts); and the tail's emitter-area ratios, plain numbers that are no
 * resistors (the PTAT source's N). Pure: the detail panel and the report both read it.
 */
import type { Design, ResistorSeries } from '#shared/engine/types';
import { TOPOLOGY_CATALOGUE, tailRatio, tailValueOhm } from '#shared/engine/topologies';
import { isOnSeries } from '#shared/units/e-series';
import { tailFields } from '../components/decision/design-fields';

export interface SizedResistor {
  /** Reference designators sharing the value, e.g. ["RC1", "RC2"]. */
  names: string[];
  valueOhm: number;
  role: string;
}

/** Every resistor of the design with its value in ohms; equal pairs share a row. */
export function sizedResistors(design: Design): SizedResistor[] {
  const rc1Ohm = design.collectorResistanceOhm;
  const rc2Ohm = rc1Ohm * (1 + (design.collectorMismatch ?? 0));
  const rows: SizedResistor[] =
    rc2Ohm === rc1Ohm
      ? [{ names: ['RC1', 'RC2'], valueOhm: rc1Ohm, role: 'Collector loads to V+' }]
      : [
          { names: ['RC1'], valueOhm: rc1Ohm, role: 'Collector load of Q1' },
          { names: ['RC2'], valueOhm: rc2Ohm, role: 'Collector load of Q2 (mismatched)' },
        ];
  const reOhm = design.pairEmitterResistanceOhm ?? 0;
  if (reOhm > 0) rows.push({ names: ['RE1', 'RE2'], valueOhm: reOhm, role: 'Pair emitter degeneration' });
  for (const resistor of TOPOLOGY_CATALOGUE[design.tail.topology].resistors) {
    rows.push({ names: [...resistor.names], valueOhm: tailValueOhm(design.tail, resistor.field), role: resistor.role });
  }
  return rows;
}

export interface SizedRatio {
  /** The design schema's title of the field ("Area ratio N"). */
  name: string;
  /** The ratio itself (8 for eight times the unit transistor's emitter area); the catalogue's default where the design leaves it out. */
  ratio: number;
  role: string;
}

/** Every emitter-area ratio of the design's tail, in the catalogue's order (none for most tails). */
export function sizedRatios(design: Design): SizedRatio[] {
  const titles = new Map(tailFields(design.tail.topology).map((f) => [f.key, f.title]));
  return TOPOLOGY_CATALOGUE[design.tail.topology].ratios.map((r) => ({ name: titles.get(`tail/${r.field}`) ?? r.field, ratio: tailRatio(design.tail, r.field), role: r.role }));
}

/** Whether a value sits on the preferred-number series the spec names. */
export function onSeries(valueOhm: number, series: ResistorSeries): boolean {
  return isOnSeries(valueOhm, series, 1e-6);
}
