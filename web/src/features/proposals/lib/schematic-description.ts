/** The words behind the schematic (its aria-label): the circuit of ENGINE-CONTRACT.md, with values. */
import type { Design, TailDesign } from '../../../../../shared/engine/types';
import { formatQuantity } from '../../../../../shared/units/format-quantity';
import { topologyName } from '../../../lib/topology-names';

const ohm = (valueOhm: number) => formatQuantity(valueOhm, 'Ohm');

function tailWords(tail: TailDesign): string {
  switch (tail.topology) {
    case 'resistor':
      return `resistor RT ${ohm(tail.resistanceOhm)} from t to V−`;
    case 'simple-mirror':
      return `Q3 diode-connected, fed from V+ through RREF ${ohm(tail.referenceResistanceOhm)}; Q4 shares Q3's base, collector at t; both emitters at V−`;
    case 'degenerated-mirror':
      return (
        `Q3 diode-connected, fed from V+ through RREF ${ohm(tail.referenceResistanceOhm)}; Q4 shares Q3's base, collector at t; ` +
        `emitter resistors RE3 and RE4 ${ohm(tail.emitterResistanceOhm)} each to V−`
      );
    case 'widlar':
      return (
        `Q3 diode-connected, fed from V+ through RREF ${ohm(tail.referenceResistanceOhm)}, emitter at V−; Q4 shares Q3's base, collector at t, ` +
        `emitter through RE4 ${ohm(tail.emitterResistanceOhm)} to V−`
      );
    case 'wilson':
      return (
        `Q3 collector fed from V+ through RREF ${ohm(tail.referenceResistanceOhm)}, emitter at V−; Q5 collector at t, base at Q3's collector, emitter at node x; ` +
        `Q4 diode-connected at x, emitter at V−; Q3's base tied to x`
      );
    case 'cascode':
      return (
        `mirror Q3 (diode-connected) and Q4 at the bottom, emitters at V−; Q5 diode-connected on Q3, fed from V+ through RREF ${ohm(tail.referenceResistanceOhm)}; ` +
        `Q6 on Q4 with its base tied to Q5's base, collector at t`
      );
  }
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
