/** The words behind the schematic (its aria-label): the circuit of ENGINE-CONTRACT.md, with values. */
import type { Design, TailDesign } from '#shared/engine/types';
import { formatQuantity } from '#shared/units/format-quantity';
import { TOPOLOGY_CATALOGUE, tailRatio, tailRatioFieldsOf, tailValueOhm, type TailField, type TailRatioField } from '#shared/engine/topologies';
import { topologyNameInText } from '../../../lib/topology-names';

const ohm = (valueOhm: number) => formatQuantity(valueOhm, 'Ohm');

/**
 * The tail's circuit in the catalogue's words, each `{field}` filled with its value: a resistor in
 * ohms, an area ratio as the plain number the words follow with "×" ("Q4 (8× Q3's area)").
 */
function tailWords(tail: TailDesign): string {
  const ratios: readonly string[] = tailRatioFieldsOf(tail.topology);
  return TOPOLOGY_CATALOGUE[tail.topology].circuitWords.replace(/\{(\w+)\}/g, (_, field: string) =>
    ratios.includes(field) ? formatQuantity(tailRatio(tail, field as TailRatioField), '1') : ohm(tailValueOhm(tail, field as TailField)),
  );
}

/**
 * The catalogue's words (written for the NPN stage) for the PNP stage, its mirror image: the
 * rails swap, and what sat at the bottom sits at the top.
 */
function mirroredWords(words: string): string {
  return words.replace(/V\+|V−|at the bottom/g, (found) => (found === 'V+' ? 'V−' : found === 'V−' ? 'V+' : 'at the top'));
}

/** A sentence describing the whole stage with its sized values. */
export function schematicDescription(design: Design): string {
  const { positiveV, negativeV } = design.supply;
  const reOhm = design.pairEmitterResistanceOhm ?? 0;
  const emitters = reOhm > 0 ? `emitters through RE1 and RE2 ${ohm(reOhm)} each to the tail node t` : 'emitters joined at the tail node t';
  if (design.device.family === 'pnp') {
    return (
      `Schematic, ${topologyNameInText(design.tail.topology)} tail, PNP stage (every transistor a PNP, the mirror image of the NPN stage). ` +
      `Tail from V+ (${formatQuantity(positiveV, 'V')}) at the top: ${mirroredWords(tailWords(design.tail))}. ` +
      `Emitter-coupled pair Q1 and Q2 hanging from it, ${emitters}, bases at in1 and in2, ` +
      `collectors c1 and c2 through RC1 and RC2 ${ohm(design.collectorResistanceOhm)} down to V− (${formatQuantity(negativeV, 'V')}).`
    );
  }
  return (
    `Schematic, ${topologyNameInText(design.tail.topology)} tail. Emitter-coupled pair Q1 and Q2, bases at in1 and in2, ` +
    `collectors c1 and c2 through RC1 and RC2 ${ohm(design.collectorResistanceOhm)} to V+ (${formatQuantity(positiveV, 'V')}), ${emitters}. ` +
    `Tail: ${tailWords(design.tail)}. V− is ${formatQuantity(negativeV, 'V')}.`
  );
}
