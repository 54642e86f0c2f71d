/** Pieces every mirror tail repeats: the reference feed from V+, diode ties, base lines, the way down to V−. */
import { formatQuantity } from '#shared/units/format-quantity';
import { DIODE_TIE_X, OUTPUT_X, RAIL_BOTTOM_Y, RAIL_TOP_Y, REFERENCE_X } from './layout';
import { Dot, Resistor, Wire, type Point } from './parts';

/** RREF from V+ down the reference column to the node at `nodeY` (dotted there). */
export function ReferenceFeed({ valueOhm, nodeY }: { valueOhm: number; nodeY: number }) {
  return (
    <>
      <Dot at={[REFERENCE_X, RAIL_TOP_Y]} />
      <Resistor x={REFERENCE_X} y1={RAIL_TOP_Y} y2={nodeY} name="RREF" value={formatQuantity(valueOhm, 'Ohm')} side="left" />
      <Dot at={[REFERENCE_X, nodeY]} />
    </>
  );
}

/** A diode connection: from a collector node across to the tie column, down to the base line. */
export function DiodeTie({ from, baseY, tieX = DIODE_TIE_X }: { from: Point; baseY: number; tieX?: number }) {
  return (
    <>
      <Wire points={[from, [tieX, from[1]], [tieX, baseY]]} />
      <Dot at={from} />
      <Dot at={[tieX, baseY]} />
    </>
  );
}

/** The line joining the reference-side and output-side bases at height `y`. */
export function BaseLine({ y }: { y: number }) {
  return <Wire points={[[REFERENCE_X + 30, y], [OUTPUT_X - 30, y]]} />;
}

/** From an emitter down to V−: a plain wire, or an emitter resistor when `resistor` is given. */
export function ToNegativeRail({ x, fromY, resistor }: { x: number; fromY: number; resistor?: { name: string; valueOhm: number; side: 'left' | 'right' } }) {
  return (
    <>
      {resistor ? (
        <Resistor x={x} y1={fromY} y2={RAIL_BOTTOM_Y} name={resistor.name} value={formatQuantity(resistor.valueOhm, 'Ohm')} side={resistor.side} />
      ) : (
        <Wire points={[[x, fromY], [x, RAIL_BOTTOM_Y]]} />
      )}
      <Dot at={[x, RAIL_BOTTOM_Y]} />
    </>
  );
}
