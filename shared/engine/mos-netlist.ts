/**
 * The SPICE netlist of a MOS stage (mos-stage.ts): the same circuit the engine solves, each
 * MOSFET an M line with its W and L and its body terminal, one `.model NMOS1 NMOS (LEVEL=1 …)`
 * (or PMOS1) card with the design's VTO, KP, LAMBDA, GAMMA, PHI, and a card of its own for a
 * mismatched M2. Analyses: `.op`, the AC differential and common-mode drives, AC 1 on one rail
 * (supply rejection), and the tail alone with `t` held at its operating-point voltage
 * (1/|i(VTAIL)| is its output resistance).
 */
import { GROUND, RAIL_NODES, TAIL_NODE, isMosfet, type CircuitElement, type MosfetElement } from './circuit';
import { NOMINAL_TEMPERATURE_C } from './constants';
import { MOS_PARAMETER_NAMES, type MosModelCard } from './mos-parameters';
import { mosStageCircuit, mosfetOwnCard, type MosDesign } from './mos-stage';
import { mosfetHasOwnModel, mosfetModelName } from './netlist';
import { formatSpiceNumber as spiceNumber } from '../units/spice-number';

export type MosNetlistAnalysis =
  | { analysis: 'op'; differentialInputV?: number }
  | { analysis: 'ac-differential' | 'ac-common-mode'; frequencyHz: number }
  | { analysis: 'ac-tail'; frequencyHz: number; tailNodeV: number }
  | { analysis: 'ac-rail'; frequencyHz: number; rail: 'positive' | 'negative' };

function modelCardLine(name: string, family: 'nmos' | 'pmos', card: MosModelCard): string {
  const words = MOS_PARAMETER_NAMES.filter((p) => card[p] !== undefined).map((p) => `${p}=${spiceNumber(card[p]!)}`);
  return `.model ${name} ${family === 'pmos' ? 'PMOS' : 'NMOS'} (LEVEL=1 ${words.join(' ')})`;
}

function elementLine(el: CircuitElement): string {
  if (isMosfet(el)) return `${el.name} ${el.drain} ${el.gate} ${el.source} ${el.body} ${mosfetModelName(el)} W=${spiceNumber(el.widthM)} L=${spiceNumber(el.lengthM)}`;
  if (el.kind === 'resistor') return `${el.name} ${el.nodes[0]} ${el.nodes[1]} ${spiceNumber(el.resistanceOhm)}`;
  if (el.kind === 'capacitor') return `${el.name} ${el.nodes[0]} ${el.nodes[1]} ${spiceNumber(el.capacitanceF)}`;
  throw new RangeError(`a MOS stage has no bipolar transistor (${el.name})`);
}

/** The netlist of a MOS design for one analysis. */
export function mosSpiceNetlist(design: MosDesign, options: MosNetlistAnalysis & { relativeTolerance?: number }): string {
  const circuit = mosStageCircuit(design);
  const family = design.device.family;
  const type = family === 'pmos' ? -1 : 1;
  const vicmV = design.inputCommonModeV ?? 0;
  const [d1, d2] = circuit.driveNodes;
  const tailOnly = options.analysis === 'ac-tail';
  const elements = circuit.elements.filter((el) => !tailOnly || el.part === 'tail');
  const lines = ['Longtail MOS input stage (figures are estimates to confirm by simulation and bench measurement)'];
  const railAc = (rail: 'positive' | 'negative') => (options.analysis === 'ac-rail' && options.rail === rail ? ' AC 1 0' : '');
  lines.push(`VP ${RAIL_NODES.positive} ${GROUND} DC ${spiceNumber(design.supply.positiveV)}${railAc('positive')}`, `VN ${RAIL_NODES.negative} ${GROUND} DC ${spiceNumber(design.supply.negativeV)}${railAc('negative')}`);
  if (options.analysis === 'ac-tail') lines.push(`VTAIL ${TAIL_NODE} ${GROUND} DC ${spiceNumber(options.tailNodeV)} AC 1 0`);
  else {
    const ac1 = options.analysis === 'ac-differential' ? ' AC 0.5 0' : options.analysis === 'ac-common-mode' ? ' AC 1 0' : '';
    const ac2 = options.analysis === 'ac-differential' ? ' AC 0.5 180' : options.analysis === 'ac-common-mode' ? ' AC 1 0' : '';
    const halfV = options.analysis === 'op' ? (options.differentialInputV ?? 0) / 2 : 0;
    if (!Number.isFinite(halfV)) throw new RangeError('differentialInputV must be a finite number');
    lines.push(`VIN1 ${d1} ${GROUND} DC ${spiceNumber(vicmV + halfV)}${ac1}`, `VIN2 ${d2} ${GROUND} DC ${spiceNumber(vicmV - halfV)}${ac2}`);
  }
  lines.push(...elements.map(elementLine));
  lines.push(modelCardLine(type === -1 ? 'PMOS1' : 'NMOS1', family, design.device.model));
  for (const el of elements) {
    if (isMosfet(el) && mosfetHasOwnModel(el)) lines.push(modelCardLine(mosfetModelName(el as MosfetElement), family, mosfetOwnCard(design.device.model, el, type)));
  }
  lines.push(`.options tnom=${spiceNumber(NOMINAL_TEMPERATURE_C)}${options.relativeTolerance !== undefined ? ` reltol=${spiceNumber(options.relativeTolerance)}` : ''}`, `.temp ${spiceNumber(design.temperatureC ?? NOMINAL_TEMPERATURE_C)}`);
  lines.push(options.analysis === 'op' ? '.op' : `.ac lin 1 ${spiceNumber(options.frequencyHz)} ${spiceNumber(options.frequencyHz)}`);
  lines.push('.end', '');
  return lines.join('\n');
}
