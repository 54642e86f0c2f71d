import { OUTPUT_X, REFERENCE_X, TAIL_NODE } from './layout';
import { Dot, Label, Npn, transistorPins, Wire } from './parts';
import { BaseLine, DiodeTie, ReferenceFeed, ToNegativeRail } from './tail-parts';

const UPPER_Y = 290;
const LOWER_Y = 385;
const NODE_X_Y = 337;
/** Column where Q4's diode connection drops from node x to the base line (beside Q4's base). */
const X_TIE_X = OUTPUT_X - 45;

/**
 * Wilson mirror: Q3 fed through RREF; Q5 (collector at t) takes its base from Q3's collector and
 * its emitter sits on node x; Q4 diode-connected at x; Q3's base tied to x.
 */
export function WilsonTail({ referenceResistanceOhm }: { referenceResistanceOhm: number }) {
  const q3 = transistorPins(REFERENCE_X, LOWER_Y, 'right');
  const q4 = transistorPins(OUTPUT_X, LOWER_Y, 'left');
  const q5 = transistorPins(OUTPUT_X, UPPER_Y, 'left');
  return (
    <g data-part="tail">
      <ReferenceFeed valueOhm={referenceResistanceOhm} nodeY={UPPER_Y} />
      <Wire points={[[REFERENCE_X, UPPER_Y], q3.collector]} />
      <Wire points={[[REFERENCE_X, UPPER_Y], q5.base]} />
      <Npn cx={OUTPUT_X} cy={UPPER_Y} base="left" name="Q5" />
      <Wire points={[[TAIL_NODE.x, TAIL_NODE.y], q5.collector]} />
      <Wire points={[q5.emitter, q4.collector]} />
      <Dot at={[OUTPUT_X, NODE_X_Y]} />
      <Label at={[OUTPUT_X + 7, NODE_X_Y + 4]} strong>
        x
      </Label>
      <DiodeTie from={[OUTPUT_X, NODE_X_Y]} baseY={LOWER_Y} tieX={X_TIE_X} />
      <Npn cx={REFERENCE_X} cy={LOWER_Y} base="right" name="Q3" />
      <Npn cx={OUTPUT_X} cy={LOWER_Y} base="left" name="Q4" />
      <BaseLine y={LOWER_Y} />
      <ToNegativeRail x={REFERENCE_X} fromY={q3.emitter[1]} />
      <ToNegativeRail x={OUTPUT_X} fromY={q4.emitter[1]} />
    </g>
  );
}
