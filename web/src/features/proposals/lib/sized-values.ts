/**
 * The resistors of a sized design, named as the schematic names them: RC1/RC2 (collector loads),
 * RE1/RE2 (pair degeneration), RT (resistor tail), RREF (mirror reference), RE3/RE4 (mirror
 * emitters; the tail's names and roles are the catalogue's, shared/engine/topologies.ts). Pure:
 * the detail panel and the schematic both read it.
 */
import type { Design, ResistorSeries } from '#shared/engine/types';
import { TOPOLOGY_CATALOGUE, tailValueOhm } from '#shared/engine/topologies';
import { isOnSeries } from '#shared/units/e-series';

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

/** Whether a value sits on the preferred-number series the spec names. */
export function onSeries(valueOhm: number, series: ResistorSeries): boolean {
  return isOnSeries(valueOhm, series, 1e-6);
}
