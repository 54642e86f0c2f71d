import { OUTPUT_X, REFERENCE_X, TAIL_NODE } from './layout';
import { Npn, transistorPins, Wire } from './parts';
import { BaseLine, DiodeTie, ReferenceFeed, ToNegativeRail } from './tail-parts';

const UPPER_Y = 290;
const LOWER_Y = 385;
const REFERENCE_NODE_Y = 245;
/** Node between Q5's emitter and Q3's collector (Q3's diode connection starts there). */
const STACK_NODE_Y = 338;

/**
 * Cascode mirror: the simple mirror Q3/Q4 at the bottom; Q5 diode-connected on Q3, fed through
 * RREF; Q6 on Q4 with its base tied to Q5's base, collector at t.
 */
export function CascodeTail({ referenceResistanceOhm }: { referenceResistanceOhm: number }) {
  const q3 = transistorPins(REFERENCE_X, LOWER_Y, 'right');
  const q4 = transistorPins(OUTPUT_X, LOWER_Y, 'left');
  const q5 = transistorPins(REFERENCE_X, UPPER_Y, 'right');
  const q6 = transistorPins(OUTPUT_X, UPPER_Y, 'left');
  return (
    <g data-part="tail">
      <ReferenceFeed valueOhm={referenceResistanceOhm} nodeY={REFERENCE_NODE_Y} />
      <Wire points={[[REFERENCE_X, REFERENCE_NODE_Y], q5.collector]} />
      <DiodeTie from={[REFERENCE_X, REFERENCE_NODE_Y]} baseY={UPPER_Y} />
      <Npn cx={REFERENCE_X} cy={UPPER_Y} base="right" name="Q5" />
      <Npn cx={OUTPUT_X} cy={UPPER_Y} base="left" name="Q6" />
      <BaseLine y={UPPER_Y} />
      <Wire points={[[TAIL_NODE.x, TAIL_NODE.y], q6.collector]} />
      <Wire points={[q5.emitter, q3.collector]} />
      <Wire points={[q6.emitter, q4.collector]} />
      <DiodeTie from={[REFERENCE_X, STACK_NODE_Y]} baseY={LOWER_Y} />
      <Npn cx={REFERENCE_X} cy={LOWER_Y} base="right" name="Q3" />
      <Npn cx={OUTPUT_X} cy={LOWER_Y} base="left" name="Q4" />
      <BaseLine y={LOWER_Y} />
      <ToNegativeRail x={REFERENCE_X} fromY={q3.emitter[1]} />
      <ToNegativeRail x={OUTPUT_X} fromY={q4.emitter[1]} />
    </g>
  );
}
