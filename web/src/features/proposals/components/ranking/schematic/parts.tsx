/**
 * Drawing parts for the app's own schematics: wires, junctions, rails, resistors (a plain box)
 * and bipolar transistors (bar, collector, emitter with its arrow, a light envelope): the NPN with
 * its emitter down and the arrow pointing out, the PNP with its emitter up (towards V+) and the
 * arrow pointing in. Coordinates are viewBox units; strokes follow currentColor so the theme
 * colours them.
 *
 * A PNP stage is the NPN drawing turned upside down between the rails (`MirroredStage`): every
 * part inside it is placed at its mirrored height, an NPN drawn there becomes a PNP (emitter up,
 * arrow in) and a PNP an NPN, while text, resistor labels and symbols stay upright. So each tail
 * is drawn once, and its PNP version hangs from V+ with its reference resistor down to V−.
 */
import { createContext, useContext, type ReactNode } from 'react';
import { RAIL_BOTTOM_Y, RAIL_TOP_Y } from './layout';

export type Point = readonly [number, number];

/** The mirrored height of a drawn height, or null when the drawing is upright. */
const MirrorContext = createContext<((y: number) => number) | null>(null);
const mirrorY = (y: number) => RAIL_TOP_Y + RAIL_BOTTOM_Y - y;

/** Draws `children` (laid out as an NPN stage) as the PNP stage: upside down between the rails. */
export function MirroredStage({ mirrored, children }: { mirrored: boolean; children: ReactNode }) {
  return <MirrorContext value={mirrored ? mirrorY : null}>{children}</MirrorContext>;
}

/** Inside a composite part that has already placed itself: its pieces draw as given. */
function Upright({ children }: { children: ReactNode }) {
  return <MirrorContext value={null}>{children}</MirrorContext>;
}

export function Wire({ points }: { points: Point[] }) {
  const mirror = useContext(MirrorContext);
  const placed = mirror ? points.map(([x, y]) => [x, mirror(y)] as const) : points;
  return <polyline points={placed.map(([x, y]) => `${x},${y}`).join(' ')} fill="none" stroke="currentColor" strokeWidth={1.4} strokeLinejoin="round" />;
}

export function Dot({ at: [x, y] }: { at: Point }) {
  const mirror = useContext(MirrorContext);
  return <circle cx={x} cy={mirror ? mirror(y) : y} r={2.6} fill="currentColor" />;
}

/** Half a label's height above its baseline: a mirrored label keeps its box, not its baseline, opposite its point. */
const LABEL_MIDDLE = 4;

/** A text label; `anchor` as SVG's text-anchor. */
export function Label({ at: [x, y], anchor = 'start', strong, soft, children }: { at: Point; anchor?: 'start' | 'middle' | 'end'; strong?: boolean; soft?: boolean; children: ReactNode }) {
  const mirror = useContext(MirrorContext);
  const baseline = mirror ? mirror(y - LABEL_MIDDLE) + LABEL_MIDDLE : y;
  return (
    <text x={x} y={baseline} textAnchor={anchor} fontSize={11} fill="currentColor" stroke="none" fontWeight={strong ? 600 : 400} opacity={soft ? 0.75 : 1}>
      {children}
    </text>
  );
}

const BODY_HALF_HEIGHT = 17;
const BODY_HALF_WIDTH = 6;

/** A vertical resistor from y1 to y2 at x, its name and value beside it. */
export function Resistor({ x, y1, y2, name, value, side = 'right' }: { x: number; y1: number; y2: number; name: string; value: string; side?: 'left' | 'right' }) {
  const mirror = useContext(MirrorContext);
  if (mirror) {
    return (
      <Upright>
        <Resistor x={x} y1={mirror(y2)} y2={mirror(y1)} name={name} value={value} side={side} />
      </Upright>
    );
  }
  const mid = (y1 + y2) / 2;
  const dx = side === 'right' ? 12 : -12;
  const anchor = side === 'right' ? 'start' : 'end';
  return (
    <g data-part={name}>
      <Wire points={[[x, y1], [x, mid - BODY_HALF_HEIGHT]]} />
      <rect x={x - BODY_HALF_WIDTH} y={mid - BODY_HALF_HEIGHT} width={BODY_HALF_WIDTH * 2} height={BODY_HALF_HEIGHT * 2} fill="none" stroke="currentColor" strokeWidth={1.4} />
      <Wire points={[[x, mid + BODY_HALF_HEIGHT], [x, y2]]} />
      <Label at={[x + dx, mid - 2]} anchor={anchor} strong>
        {name}
      </Label>
      <Label at={[x + dx, mid + 12]} anchor={anchor}>
        {value}
      </Label>
    </g>
  );
}

/** Terminal points of a transistor drawn with its collector/emitter column at cx. */
export function transistorPins(cx: number, cy: number, base: 'left' | 'right') {
  const dx = base === 'left' ? 1 : -1;
  return { collector: [cx, cy - 30] as Point, emitter: [cx, cy + 30] as Point, base: [cx - 30 * dx, cy] as Point };
}

/** An NPN transistor: base lead on `base` side, collector up, emitter down with its arrow pointing out; `detail` (an emitter-area ratio, say) under its name. */
export function Npn({ cx, cy, base, name, detail }: { cx: number; cy: number; base: 'left' | 'right'; name: string; detail?: string }) {
  const mirror = useContext(MirrorContext);
  if (mirror) {
    return (
      <Upright>
        <Pnp cx={cx} cy={mirror(cy)} base={base} name={name} detail={detail} />
      </Upright>
    );
  }
  const dx = base === 'left' ? 1 : -1;
  const barX = cx - 14 * dx;
  const pins = transistorPins(cx, cy, base);
  // Arrow on the emitter leg, 80 % of the way from the bar, pointing away from the bar (NPN).
  const [ux, uy] = unit(cx - barX, 9);
  const tip: Point = [barX + 0.8 * (cx - barX), cy + 7 + 0.8 * 9];
  return (
    <g data-device={name} data-polarity="npn">
      <TransistorBody cx={cx} cy={cy} dx={dx} base={pins.base} />
      <Wire points={[[barX, cy - 6], [cx, cy - 15], pins.collector]} />
      <Wire points={[[barX, cy + 6], [cx, cy + 15], pins.emitter]} />
      <ArrowHead tip={tip} direction={[ux, uy]} />
      <TransistorName cx={cx} cy={cy} dx={dx} name={name} detail={detail} />
    </g>
  );
}

/** Terminal points of a PNP drawn with its emitter/collector column at cx: emitter up, collector down. */
export function pnpPins(cx: number, cy: number, base: 'left' | 'right') {
  const { collector, emitter, base: basePin } = transistorPins(cx, cy, base);
  return { emitter: collector, collector: emitter, base: basePin };
}

/** A PNP transistor: base lead on `base` side, emitter up with its arrow pointing in (towards the bar), collector down. */
export function Pnp({ cx, cy, base, name, detail }: { cx: number; cy: number; base: 'left' | 'right'; name: string; detail?: string }) {
  const mirror = useContext(MirrorContext);
  if (mirror) {
    return (
      <Upright>
        <Npn cx={cx} cy={mirror(cy)} base={base} name={name} detail={detail} />
      </Upright>
    );
  }
  const dx = base === 'left' ? 1 : -1;
  const barX = cx - 14 * dx;
  const pins = pnpPins(cx, cy, base);
  // Arrow on the emitter leg, 30 % of the way from the bar, pointing into the bar (PNP).
  const [ux, uy] = unit(barX - cx, 9);
  const tip: Point = [barX + 0.3 * (cx - barX), cy - 7 - 0.3 * 9];
  return (
    <g data-device={name} data-polarity="pnp">
      <TransistorBody cx={cx} cy={cy} dx={dx} base={pins.base} />
      <Wire points={[[barX, cy - 6], [cx, cy - 15], pins.emitter]} />
      <Wire points={[[barX, cy + 6], [cx, cy + 15], pins.collector]} />
      <ArrowHead tip={tip} direction={[ux, uy]} />
      <TransistorName cx={cx} cy={cy} dx={dx} name={name} detail={detail} />
    </g>
  );
}

/** The envelope, the bar and the base lead every bipolar symbol shares. */
function TransistorBody({ cx, cy, dx, base }: { cx: number; cy: number; dx: number; base: Point }) {
  const barX = cx - 14 * dx;
  return (
    <>
      <circle cx={cx - 6 * dx} cy={cy} r={20} fill="none" stroke="currentColor" strokeWidth={0.8} opacity={0.45} />
      <line x1={barX} y1={cy - 11} x2={barX} y2={cy + 11} stroke="currentColor" strokeWidth={2.4} />
      <Wire points={[base, [barX, cy]]} />
    </>
  );
}

/** An emitter arrow: a filled head whose point is `tip`, pointing along the unit vector `direction`. */
function ArrowHead({ tip, direction: [ux, uy] }: { tip: Point; direction: [number, number] }) {
  const head = [tip, [tip[0] - 6 * ux - 3.2 * uy, tip[1] - 6 * uy + 3.2 * ux], [tip[0] - 6 * ux + 3.2 * uy, tip[1] - 6 * uy - 3.2 * ux]];
  return <polygon points={head.map(([x, y]) => `${x},${y}`).join(' ')} fill="currentColor" />;
}

/** The designator on the side away from the base, and the detail line under it. */
function TransistorName({ cx, cy, dx, name, detail }: { cx: number; cy: number; dx: number; name: string; detail?: string }) {
  const at: Point = [cx + 18 * dx, cy + 4];
  const anchor = dx > 0 ? 'start' : 'end';
  return (
    <>
      <Label at={at} anchor={anchor} strong>
        {name}
      </Label>
      {detail !== undefined && (
        <Label at={[at[0], at[1] + 14]} anchor={anchor}>
          {detail}
        </Label>
      )}
    </>
  );
}

function unit(x: number, y: number): [number, number] {
  const length = Math.hypot(x, y);
  return [x / length, y / length];
}

/** A supply rail across the drawing, its name and voltage at the right end. */
export function Rail({ y, x1, x2, name, volts, below }: { y: number; x1: number; x2: number; name: string; volts: string; below?: boolean }) {
  return (
    <g data-part={name}>
      <line x1={x1} y1={y} x2={x2} y2={y} stroke="currentColor" strokeWidth={2} />
      <Label at={[x2, below ? y + 15 : y - 7]} anchor="end" strong>
        {name} <tspan fontWeight={400}>{volts}</tspan>
      </Label>
    </g>
  );
}

/** An input terminal: an open circle with its net name. */
export function Terminal({ at, name, side }: { at: Point; name: string; side: 'left' | 'right' }) {
  const mirror = useContext(MirrorContext);
  if (mirror) {
    return (
      <Upright>
        <Terminal at={[at[0], mirror(at[1])]} name={name} side={side} />
      </Upright>
    );
  }
  return (
    <g>
      <circle cx={at[0]} cy={at[1]} r={3.2} fill="none" stroke="currentColor" strokeWidth={1.4} />
      <Label at={[at[0] + (side === 'left' ? -7 : 7), at[1] + 4]} anchor={side === 'left' ? 'end' : 'start'}>
        {name}
      </Label>
    </g>
  );
}
