/** The two-transistor mirror Q3/Q4 the simple, degenerated and Widlar tails share; RE3/RE4 when given. */
import { OUTPUT_X, REFERENCE_X, TAIL_NODE } from './layout';
import { Npn, transistorPins, Wire } from './parts';
import { BaseLine, DiodeTie, ReferenceFeed, ToNegativeRail } from './tail-parts';

const MIRROR_Y = 340;
const REFERENCE_NODE_Y = 280;

export function TwoTransistorMirror({ referenceOhm, re3Ohm, re4Ohm }: { referenceOhm: number; re3Ohm?: number; re4Ohm?: number }) {
  const q3 = transistorPins(REFERENCE_X, MIRROR_Y, 'right');
  const q4 = transistorPins(OUTPUT_X, MIRROR_Y, 'left');
  return (
    <g data-part="tail">
      <ReferenceFeed valueOhm={referenceOhm} nodeY={REFERENCE_NODE_Y} />
      <Wire points={[[REFERENCE_X, REFERENCE_NODE_Y], q3.collector]} />
      <DiodeTie from={[REFERENCE_X, REFERENCE_NODE_Y]} baseY={MIRROR_Y} />
      <Npn cx={REFERENCE_X} cy={MIRROR_Y} base="right" name="Q3" />
      <Npn cx={OUTPUT_X} cy={MIRROR_Y} base="left" name="Q4" />
      <BaseLine y={MIRROR_Y} />
      <Wire points={[[TAIL_NODE.x, TAIL_NODE.y], q4.collector]} />
      <ToNegativeRail x={REFERENCE_X} fromY={q3.emitter[1]} resistor={re3Ohm ? { name: 'RE3', valueOhm: re3Ohm, side: 'left' } : undefined} />
      <ToNegativeRail x={OUTPUT_X} fromY={q4.emitter[1]} resistor={re4Ohm ? { name: 'RE4', valueOhm: re4Ohm, side: 'right' } : undefined} />
    </g>
  );
}
