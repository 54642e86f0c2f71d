import type { ComponentType } from 'react';
import type { Design } from '#shared/engine/types';
import type { TailDesign, TailOf, TopologyId } from '#shared/engine/topologies';
import { formatQuantity } from '#shared/units/format-quantity';
import { schematicDescription } from '../../../lib/schematic-description';
import { CascodeTail } from './cascode-tail';
import { DegeneratedMirrorTail } from './degenerated-mirror-tail';
import { RAIL_BOTTOM_Y, RAIL_LEFT_X, RAIL_RIGHT_X, RAIL_TOP_Y, VIEW } from './layout';
import { PairDrawing } from './pair-drawing';
import { MirroredStage, Rail } from './parts';
import { PtatTail } from './ptat-tail';
import { ResistorTail } from './resistor-tail';
import { SimpleMirrorTail } from './simple-mirror-tail';
import { WidlarTail } from './widlar-tail';
import { WilsonTail } from './wilson-tail';

/**
 * One drawing per tail topology, each given its own tail's values; typed over every topology id,
 * so a topology of the catalogue without a drawing fails to compile.
 */
const TAIL_DRAWINGS: { [K in TopologyId]: ComponentType<TailOf<K>> } = {
  resistor: ResistorTail,
  'simple-mirror': SimpleMirrorTail,
  'degenerated-mirror': DegeneratedMirrorTail,
  widlar: WidlarTail,
  wilson: WilsonTail,
  cascode: CascodeTail,
  ptat: PtatTail,
};

function TailDrawing({ tail }: { tail: TailDesign }) {
  const Drawing = TAIL_DRAWINGS[tail.topology] as ComponentType<TailDesign>;
  return <Drawing {...tail} />;
}

/**
 * The option's stage drawn by the app: the pair in soft ink, the tail element (what differs
 * between options) in the accent colour, on screen and on paper (styles/app.css keeps it when
 * printing). Every part draws in currentColor, so its group decides its colour. A PNP stage
 * (`device.family` "pnp") is drawn as its own mirror image: the tail from V+ at the top, the pair of
 * PNPs hanging from it, the loads down to V−.
 */
export function OptionSchematic({ design, className }: { design: Design; className?: string }) {
  const negativeV = design.supply.negativeV;
  const pnp = design.device.family === 'pnp';
  return (
    <svg viewBox={`0 0 ${VIEW.width} ${VIEW.height}`} data-family={pnp ? 'pnp' : 'npn'} role="img" aria-label={schematicDescription(design)} className={className}>
      <g data-accent="none" className="text-ink-soft opacity-60 dark:text-night-ink-soft">
        <Rail y={RAIL_TOP_Y} x1={RAIL_LEFT_X} x2={RAIL_RIGHT_X} name="V+" volts={formatQuantity(design.supply.positiveV, 'V')} />
        <Rail y={RAIL_BOTTOM_Y} x1={RAIL_LEFT_X} x2={RAIL_RIGHT_X} name="V−" volts={negativeV === 0 ? '0 V (ground)' : formatQuantity(negativeV, 'V')} below />
        <MirroredStage mirrored={pnp}>
          <PairDrawing design={design} />
        </MirroredStage>
      </g>
      <g data-accent="tail" className="schematic-tail text-fern dark:text-fern-bright">
        <MirroredStage mirrored={pnp}>
          <TailDrawing tail={design.tail} />
        </MirroredStage>
      </g>
    </svg>
  );
}
