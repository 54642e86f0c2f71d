/** Shared coordinates of the schematic (viewBox units), so the pair and every tail line up. */
export const VIEW = { width: 540, height: 476 } as const;
export const RAIL_TOP_Y = 30;
export const RAIL_BOTTOM_Y = 448;
/** Tail node t: where the pair's emitters join and the tail element hangs. */
export const TAIL_NODE = { x: 320, y: 236 } as const;
/** Column of a mirror's reference side (RREF, Q3, Q5 of the cascode). */
export const REFERENCE_X = 110;
/** Column of the tail's output side (Q4, Q5 of the Wilson, Q6), under t. */
export const OUTPUT_X = TAIL_NODE.x;
/** Column where a diode connection drops from a collector to its base line. */
export const DIODE_TIE_X = 172;
/** x of the drawing's left and right rails' ends. */
export const RAIL_LEFT_X = 40;
export const RAIL_RIGHT_X = 500;
