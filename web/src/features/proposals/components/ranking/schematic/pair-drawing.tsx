import type { Design } from '#shared/engine/types';
import { formatQuantity } from '#shared/units/format-quantity';
import { Dot, Label, Npn, Resistor, Terminal, transistorPins, Wire } from './parts';
import { RAIL_TOP_Y, TAIL_NODE } from './layout';

const Q1 = { cx: 250, cy: 150 } as const;
const Q2 = { cx: 390, cy: 150 } as const;

/** The emitter-coupled pair: Q1/Q2, RC1/RC2 to V+, optional RE1/RE2, joined at the tail node t. */
export function PairDrawing({ design }: { design: Design }) {
  const rc1Ohm = design.collectorResistanceOhm;
  const rc2Ohm = rc1Ohm * (1 + (design.collectorMismatch ?? 0));
  const reOhm = design.pairEmitterResistanceOhm ?? 0;
  const q1 = transistorPins(Q1.cx, Q1.cy, 'left');
  const q2 = transistorPins(Q2.cx, Q2.cy, 'right');
  const joinY = TAIL_NODE.y;
  return (
    <g data-part="pair">
      <Resistor x={Q1.cx} y1={RAIL_TOP_Y} y2={q1.collector[1]} name="RC1" value={formatQuantity(rc1Ohm, 'Ohm')} side="left" />
      <Resistor x={Q2.cx} y1={RAIL_TOP_Y} y2={q2.collector[1]} name="RC2" value={formatQuantity(rc2Ohm, 'Ohm')} side="right" />
      <Dot at={[Q1.cx, RAIL_TOP_Y]} />
      <Dot at={[Q2.cx, RAIL_TOP_Y]} />
      <Label at={[Q1.cx + 6, q1.collector[1] - 3]} soft>
        c1
      </Label>
      <Label at={[Q2.cx - 6, q2.collector[1] - 3]} anchor="end" soft>
        c2
      </Label>
      <Npn cx={Q1.cx} cy={Q1.cy} base="left" name="Q1" />
      <Npn cx={Q2.cx} cy={Q2.cy} base="right" name="Q2" />
      <Wire points={[q1.base, [q1.base[0] - 16, q1.base[1]]]} />
      <Wire points={[q2.base, [q2.base[0] + 16, q2.base[1]]]} />
      <Terminal at={[q1.base[0] - 19, q1.base[1]]} name="in1" side="left" />
      <Terminal at={[q2.base[0] + 19, q2.base[1]]} name="in2" side="right" />
      {reOhm > 0 ? (
        <>
          <Resistor x={Q1.cx} y1={q1.emitter[1]} y2={joinY} name="RE1" value={formatQuantity(reOhm, 'Ohm')} side="left" />
          <Resistor x={Q2.cx} y1={q2.emitter[1]} y2={joinY} name="RE2" value={formatQuantity(reOhm, 'Ohm')} side="right" />
        </>
      ) : (
        <>
          <Wire points={[q1.emitter, [Q1.cx, joinY]]} />
          <Wire points={[q2.emitter, [Q2.cx, joinY]]} />
        </>
      )}
      <Wire points={[[Q1.cx, joinY], [Q2.cx, joinY]]} />
      <Dot at={[TAIL_NODE.x, TAIL_NODE.y]} />
      <Label at={[TAIL_NODE.x + 7, TAIL_NODE.y - 6]} strong>
        t
      </Label>
    </g>
  );
}
