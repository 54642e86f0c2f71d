import { formatQuantity } from '#shared/units/format-quantity';
import { RAIL_BOTTOM_Y, TAIL_NODE } from './layout';
import { Dot, Resistor } from './parts';

/** Resistor tail: RT from t to V−. */
export function ResistorTail({ resistanceOhm }: { resistanceOhm: number }) {
  return (
    <g data-part="tail">
      <Resistor x={TAIL_NODE.x} y1={TAIL_NODE.y} y2={RAIL_BOTTOM_Y} name="RT" value={formatQuantity(resistanceOhm, 'Ohm')} />
      <Dot at={[TAIL_NODE.x, RAIL_BOTTOM_Y]} />
    </g>
  );
}
