/** The words behind the schematic (its aria-label): the circuit of ENGINE-CONTRACT.md, with values. */
import type { Design, TailDesign } from '#shared/engine/types';
import { formatQuantity } from '#shared/units/format-quantity';
import { TOPOLOGY_CATALOGUE, tailValueOhm, topologyName, type TailField } from '#shared/engine/topologies';

const ohm = (valueOhm: number) => formatQuantity(valueOhm, 'Ohm');

/** The tail's circuit in the catalogue's words, each `{field}` filled with its value. */
function tailWords(tail: TailDesign): string {
  return TOPOLOGY_CATALOGUE[tail.topology].circuitWords.replace(/\{(\w+)\}/g, (_, field: TailField) => ohm(tailValueOhm(tail, field)));
}

/** A sentence describing the whole stage with its sized values. */
export function schematicDescription(design: Design): string {
  const { positiveV, negativeV } = design.supply;
  const reOhm = design.pairEmitterResistanceOhm ?? 0;
  const emitters = reOhm > 0 ? `emitters through RE1 and RE2 ${ohm(reOhm)} each to the tail node t` : 'emitters joined at the tail node t';
  return (
    `Schematic, ${topologyName(design.tail.topology).toLowerCase()} tail. Emitter-coupled pair Q1 and Q2, bases at in1 and in2, ` +
    `collectors c1 and c2 through RC1 and RC2 ${ohm(design.collectorResistanceOhm)} to V+ (${formatQuantity(positiveV, 'V')}), ${emitters}. ` +
    `Tail: ${tailWords(design.tail)}. V− is ${formatQuantity(negativeV, 'V')}.`
  );
}
