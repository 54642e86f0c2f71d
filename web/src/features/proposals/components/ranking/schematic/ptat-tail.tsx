import { formatQuantity } from '#shared/units/format-quantity';
import { formatRatio } from '#shared/units/figures';
import { OUTPUT_X, RAIL_LEFT_X, RAIL_TOP_Y, TAIL_NODE } from './layout';
import { Dot, Npn, Pnp, pnpPins, Resistor, transistorPins, Wire } from './parts';
import { DiodeTie, ToNegativeRail } from './tail-parts';

/** Column of Q4's collector node (Q8 above, Q4, RE4 below): the drawing's left edge. */
const P4_X = RAIL_LEFT_X;
/** Column of Q3's collector node (Q7 above, Q3 below). */
const REF_X = 122;
/** Column of the start-up resistor, dropping on to Q3's diode tie; left of the pair's input terminal. */
const STARTUP_X = 164;
const PNP_Y = 85;
/** Q4 sits higher than Q3, so its base meets Q3's collector node with a straight wire. */
const Q4_Y = 300;
const NPN_Y = 340;
/** Where Q8's diode connection leaves its collector, and where RSU and Q3's diode tie meet Q3's collector node. */
const P4_TIE_Y = 130;
const REF_TIE_Y = 270;
/** RSU's body, between the pair's input terminal and its emitter resistor's labels. */
const STARTUP_BODY = { top: 150, bottom: 206 } as const;

/**
 * PTAT (constant-gm) source: Q3 (diode-connected) and Q4 (N times its emitter area, emitter
 * through RE4) form the ΔVBE cell; the PNP mirror Q7/Q8 from V+ (Q8 diode-connected on Q4's
 * collector, Q7 feeding Q3's) forces equal currents in both; RSU starts it; Q9 shares Q3's base
 * and sinks the tail current at t. Area ratios are labelled as plain ratios under their transistors.
 */
export function PtatTail({ emitterResistanceOhm, startupResistanceOhm, areaRatio, outputAreaRatio = 1 }: { emitterResistanceOhm: number; startupResistanceOhm: number; areaRatio: number; outputAreaRatio?: number }) {
  const q7 = pnpPins(REF_X, PNP_Y, 'left');
  const q8 = pnpPins(P4_X, PNP_Y, 'right');
  const q3 = transistorPins(REF_X, NPN_Y, 'right');
  const q4 = transistorPins(P4_X, Q4_Y, 'right');
  const q9 = transistorPins(OUTPUT_X, NPN_Y, 'left');
  return (
    <g data-part="tail">
      {/* PNP mirror from V+ */}
      <Wire points={[[P4_X, RAIL_TOP_Y], q8.emitter]} />
      <Wire points={[[REF_X, RAIL_TOP_Y], q7.emitter]} />
      <Dot at={[P4_X, RAIL_TOP_Y]} />
      <Dot at={[REF_X, RAIL_TOP_Y]} />
      <Pnp cx={P4_X} cy={PNP_Y} base="right" name="Q8" />
      <Pnp cx={REF_X} cy={PNP_Y} base="left" name="Q7" />
      <Wire points={[q8.base, q7.base]} />
      <DiodeTie from={[P4_X, P4_TIE_Y]} baseY={PNP_Y} tieX={(q8.base[0] + q7.base[0]) / 2} />
      {/* Q4's collector node under Q8; Q3's under Q7 */}
      <Wire points={[q8.collector, q4.collector]} />
      <Wire points={[q7.collector, q3.collector]} />
      {/* Start-up from V+ on to Q3's diode tie */}
      <Dot at={[STARTUP_X, RAIL_TOP_Y]} />
      <Wire points={[[STARTUP_X, RAIL_TOP_Y], [STARTUP_X, STARTUP_BODY.top]]} />
      <Resistor x={STARTUP_X} y1={STARTUP_BODY.top} y2={STARTUP_BODY.bottom} name="RSU" value={formatQuantity(startupResistanceOhm, 'Ohm')} />
      <Wire points={[[STARTUP_X, STARTUP_BODY.bottom], [STARTUP_X, REF_TIE_Y]]} />
      <Dot at={[STARTUP_X, REF_TIE_Y]} />
      <DiodeTie from={[REF_X, REF_TIE_Y]} baseY={NPN_Y} tieX={STARTUP_X} />
      {/* The ΔVBE cell and the output */}
      <Wire points={[q4.base, [REF_X, Q4_Y]]} />
      <Dot at={[REF_X, Q4_Y]} />
      <Npn cx={P4_X} cy={Q4_Y} base="right" name="Q4" detail={formatRatio(areaRatio)} />
      <Npn cx={REF_X} cy={NPN_Y} base="right" name="Q3" />
      <Npn cx={OUTPUT_X} cy={NPN_Y} base="left" name="Q9" detail={formatRatio(outputAreaRatio)} />
      <Wire points={[q3.base, q9.base]} />
      <Wire points={[[TAIL_NODE.x, TAIL_NODE.y], q9.collector]} />
      <ToNegativeRail x={P4_X} fromY={q4.emitter[1]} resistor={{ name: 'RE4', valueOhm: emitterResistanceOhm, side: 'right' }} />
      <ToNegativeRail x={REF_X} fromY={q3.emitter[1]} />
      <ToNegativeRail x={OUTPUT_X} fromY={q9.emitter[1]} />
    </g>
  );
}
