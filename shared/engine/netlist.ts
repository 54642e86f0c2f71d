/**
 * The product's one SPICE netlist writer (SPICE3 syntax, as ngspice reads it), and a small reader
 * of element lines. The netlist is built from `stageCircuit(design)`, so the simulated circuit is
 * the predicted one by construction. Verification jobs, `.cir` export and the reference tests
 * all go through `spiceNetlist`: to get another analysis, call it with other options — never
 * edit a netlist's text with string replaces (".options" contains ".op").
 */
import type { Design, DeviceParams } from './types';
import { GROUND, RAIL_NODES, TAIL_NODE, isTransistor, stageCircuit, stageFamily } from './circuit';
import type { CircuitElement, MosfetElement, TransistorElement } from './circuit';
import { scaledDevice } from './stage-solve';
import { BJT_PARAMETER_NAMES, hasModelCard } from './bjt-parameters';
import { earlyVoltageOrInfinityV, forwardBeta, nominalSaturationCurrentA, pnpDeviceOf } from './device';
import { NOMINAL_TEMPERATURE_C } from './constants';
import { commentLines } from '../text/plain-text';
import { formatSpiceNumber as spiceNumber, parseSpiceNumber } from '../units/spice-number';

/** The `.model` name every transistor of an NPN stage uses. */
export const SPICE_MODEL_NAME = 'QNPN';
/** The PNP's `.model` name: every transistor of a PNP stage (`device.family` "pnp"), or an NPN stage's PNPs (the `ptat` tail's mirror, `device.pnp`). */
export const PNP_MODEL_NAME = 'QPNP';
/** Supply sources: `i(vp)`, `i(vn)` in ngspice's output. */
export const SUPPLY_SOURCES = { positive: 'VP', negative: 'VN' } as const;
/** Input sources on in1 and in2: `i(vin1)`, `i(vin2)`. */
export const INPUT_SOURCES = ['VIN1', 'VIN2'] as const;
/** The test source holding the tail node in an `ac-tail` netlist: Rout = 1/|i(vtail)|. */
export const TAIL_TEST_SOURCE = 'VTAIL';
/**
 * The one differential source of a `dc-differential`, `noise` or `tran-step` netlist: v(VD) is
 * the differential input, split over the two drive nodes by noiseless controlled sources (so a
 * `.noise` analysis has a single input source and a `.dc` sweep a single swept one).
 */
export const DIFFERENTIAL_SOURCE = 'VD';
/** The common-mode source under the two halves of the split differential drive. */
export const COMMON_MODE_SOURCE = 'VCM';
/** The controlled sources putting +v(VD)/2 and −v(VD)/2 on the drive nodes over the common mode. */
export const SPLIT_SOURCES = ['EIN1', 'EIN2'] as const;
/** Default edge of the `tran-step` drive, s (the contract's 1 ns). */
export const STEP_EDGE_S = 1e-9;

/** A logarithmic AC sweep, `.ac dec pointsPerDecade startHz stopHz`. */
export interface AcSweep {
  startHz: number;
  stopHz: number;
  pointsPerDecade: number;
}

/**
 * Which single analysis the netlist runs (ngspice returns only the first plot of a batch run,
 * so a netlist carries exactly one analysis card):
 * - `op`: DC operating point; `transistorVectors` adds ngspice's own figures of every transistor
 *   to the result (`.save all @q1[gm] …`: node voltages and source currents stay in it).
 * - `ac-differential`: in1 AC 0.5 ∠0°, in2 AC 0.5 ∠180°, so v(in1 − in2) = 1 (contract drive).
 * - `ac-common-mode`: in1 and in2 both AC 1 ∠0°, so v_cm = 1.
 * - `ac-tail`: the tail element alone (part 'tail'), its node t held by an ideal source at DC
 *   `tailNodeV` (t's operating-point voltage) and AC 1, so Rout = 1/|i(vtail)|.
 * - `op` with `differentialInputV`: the drive nodes at the common mode ± half of it (an offset
 *   input, v(drive1) − v(drive2) = differentialInputV).
 * - `dc-differential`: `.dc VD start stop step`, the one differential source VD swept (a
 *   negative step sweeps downwards).
 * - `ac-rail`: that rail's source AC 1 ∠0°, the inputs at DC only (supply rejection).
 * - `noise`: `.noise v(c1,c2) VD dec …`, VD with AC 1: ngspice's input-referred density is the
 *   output noise over the gain from VD, i.e. from the differential drive.
 * - `tran-step`: VD steps from `fromV` to `toV` in `edgeS` (default STEP_EDGE_S) after `delayS`,
 *   `.tran stepS stopS` with the step as the largest internal step too.
 */
export type NetlistOptions = (
  | { analysis: 'op'; transistorVectors?: readonly TransistorVector[]; differentialInputV?: number }
  | ({ analysis: 'ac-differential' } & AcSweep)
  | ({ analysis: 'ac-common-mode' } & AcSweep)
  | ({ analysis: 'ac-tail'; tailNodeV: number } & AcSweep)
  | { analysis: 'dc-differential'; startV: number; stopV: number; stepV: number }
  | ({ analysis: 'ac-rail'; rail: keyof typeof RAIL_NODES } & AcSweep)
  | ({ analysis: 'noise' } & AcSweep)
  | { analysis: 'tran-step'; fromV: number; toV: number; delayS: number; stepS: number; stopS: number; edgeS?: number }
) &
  NetlistSolverSettings &
  NetlistCardSettings;

/**
 * The rest of a library card: parameters SPICE reads that the design's device cannot carry
 * (`SPICE_ONLY_PARAMETERS` of shared/devices/model-card.ts: TNOM, ITF, XTF, RBM, …), written into
 * the `.model` card after the design's own so SPICE simulates the whole card. Names must be plain
 * SPICE parameter names (letters, digits, `_`); anything else is refused.
 */
export interface NetlistCardSettings {
  spiceOnlyParameters?: Readonly<Record<string, number>>;
}

/**
 * Solver settings written on the `.options` line. Omitted: ngspice's defaults (RELTOL = 1e-3),
 * which is what an exported `.cir` should carry; verification runs may ask for a tighter one.
 */
export interface NetlistSolverSettings {
  /** ngspice RELTOL, the relative convergence tolerance of the Newton iteration. */
  relativeTolerance?: number;
}

export type NetlistAnalysis = NetlistOptions['analysis'];

/**
 * Device figures ngspice reports per bipolar transistor at the operating point [SPICE]: `gm`
 * (hybrid-π transconductance, VCE held), `go` (output conductance), `gpi`, `gmu` (base–emitter
 * and base–collector input conductances), `ic` and `ib` (terminal currents, A).
 */
export type TransistorVector = 'gm' | 'go' | 'gpi' | 'gmu' | 'ic' | 'ib';

function elementLine(element: CircuitElement, stageKind: StageKind): string {
  switch (element.kind) {
    case 'resistor':
      return `${element.name} ${element.nodes[0]} ${element.nodes[1]} ${spiceNumber(element.resistanceOhm)}`;
    case 'capacitor':
      return `${element.name} ${element.nodes[0]} ${element.nodes[1]} ${spiceNumber(element.capacitanceF)}`;
    case 'npn':
    case 'pnp': {
      const area = element.area !== 1 ? ` area=${spiceNumber(element.area)}` : '';
      return `${element.name} ${element.collector} ${element.base} ${element.emitter} ${element.substrate} ${transistorModelName(element, stageKind)}${area}`;
    }
    case 'nmos':
    case 'pmos':
      return `${element.name} ${element.drain} ${element.gate} ${element.source} ${element.body} ${mosfetModelName(element)} W=${spiceNumber(element.widthM)} L=${spiceNumber(element.lengthM)}`;
  }
}

/** The `.model` a MOSFET uses: `NMOS1` or `PMOS1`, or its own (`NMOS1_M2`) when its VTO or KP differ from the card's. */
export function mosfetModelName(element: MosfetElement): string {
  const base = element.kind === 'pmos' ? 'PMOS1' : 'NMOS1';
  return mosfetHasOwnModel(element) ? `${base}_${element.name.toUpperCase()}` : base;
}

/** Whether a MOSFET has its own VTO or KP (a mismatched pair device), and so its own `.model` card. */
export function mosfetHasOwnModel(element: MosfetElement): boolean {
  return element.thresholdMismatchV !== undefined || element.transconductanceScale !== undefined;
}

/** Whether a transistor has its own BF or VAF (a mismatched pair transistor), and so its own `.model` card. */
function hasOwnModel(element: TransistorElement): boolean {
  return element.betaScale !== undefined || element.earlyVoltageScale !== undefined;
}

/** The transistor type of a stage (`device.family`). */
type StageKind = ReturnType<typeof stageFamily>;

/** The `.model` name of a stage's own device: `QNPN`, or `QPNP` for a PNP stage. */
function stageModelName(stageKind: StageKind): string {
  return stageKind === 'pnp' ? PNP_MODEL_NAME : SPICE_MODEL_NAME;
}

/**
 * The `.model` a transistor uses: the stage's, or its own (`QNPN_Q2`, `QPNP_Q2`) when its BF or
 * VAF differ; an NPN stage's PNP, `QPNP`.
 */
function transistorModelName(element: TransistorElement, stageKind: StageKind): string {
  if (element.kind !== stageKind) return PNP_MODEL_NAME;
  const stageName = stageModelName(stageKind);
  return hasOwnModel(element) ? `${stageName}_${element.name.toUpperCase()}` : stageName;
}

/**
 * `.model` card: with `device.model`, every parameter the card gives, by its SPICE name in the
 * list's order (a 0 for VAF, IKF, VAR or IKR stays 0, which SPICE reads as infinite); without
 * one, IS at TNOM (the effective one), BF, and VAF unless infinite [SPICE]. Then the library
 * card's SPICE-only parameters, when the netlist is given them.
 */
function modelCard(device: DeviceParams, extra: NetlistCardSettings, name = SPICE_MODEL_NAME, type: 'NPN' | 'PNP' = 'NPN'): string {
  const card = hasModelCard(device) ? device.model : undefined;
  const parameters = card
    ? BJT_PARAMETER_NAMES.filter((parameter) => card[parameter] !== undefined).map((parameter) => `${parameter}=${spiceNumber(card[parameter]!)}`)
    : [`IS=${spiceNumber(nominalSaturationCurrentA(device))}`, `BF=${spiceNumber(forwardBeta(device))}`];
  const vafV = earlyVoltageOrInfinityV(device);
  if (!card && Number.isFinite(vafV)) parameters.push(`VAF=${spiceNumber(vafV)}`);
  return `.model ${name} ${type} (${[...parameters, ...spiceOnlyWords(extra)].join(' ')})`;
}

/**
 * The stage's `.model` card (NPN, or PNP for a PNP stage), one per transistor with its own BF or
 * VAF, and an NPN stage's PNP card (`device.pnp`, without the library card's SPICE-only
 * parameters, which belong to the NPN) when the circuit has a PNP.
 */
function modelCards(design: Design, elements: readonly CircuitElement[], extra: NetlistCardSettings): string[] {
  const stageKind = stageFamily(design);
  const type = stageKind === 'pnp' ? 'PNP' : 'NPN';
  const own = elements.filter((element): element is TransistorElement => element.kind === stageKind && hasOwnModel(element));
  const pnp = stageKind === 'npn' && elements.some((element) => element.kind === 'pnp') ? [modelCard(pnpDeviceOf(design), {}, PNP_MODEL_NAME, 'PNP')] : [];
  return [
    modelCard(design.device, extra, stageModelName(stageKind), type),
    ...own.map((element) => modelCard(scaledDevice(design.device, element.betaScale, element.earlyVoltageScale), extra, transistorModelName(element, stageKind), type)),
    ...pnp,
  ];
}

const PARAMETER_NAME = /^[A-Za-z][A-Za-z0-9_]*$/;

/** `NAME=value` words of the card's SPICE-only parameters. */
function spiceOnlyWords(extra: NetlistCardSettings): string[] {
  return Object.entries(extra.spiceOnlyParameters ?? {}).map(([name, value]) => {
    if (!PARAMETER_NAME.test(name) || !Number.isFinite(value)) throw new RangeError(`not a SPICE model parameter: ${JSON.stringify(name)}`);
    return `${name.toUpperCase()}=${spiceNumber(value)}`;
  });
}

function dcSource(name: string, node: string, dcV: number, ac = ''): string {
  return `${name} ${node} ${GROUND} DC ${spiceNumber(dcV)}${ac}`;
}

/** A finite number, or a RangeError naming the field. */
function finite(name: string, value: number): number {
  if (!Number.isFinite(value)) throw new RangeError(`${name} must be a finite number`);
  return value;
}

/** `.options tnom [reltol]`: TNOM = 27 °C, where the card's parameters hold [SPICE], and solver settings. */
function optionsCard(settings: NetlistSolverSettings): string {
  const words = [`tnom=${spiceNumber(NOMINAL_TEMPERATURE_C)}`];
  if (settings.relativeTolerance !== undefined) {
    if (!(settings.relativeTolerance > 0 && settings.relativeTolerance < 1)) throw new RangeError('relativeTolerance must be in (0, 1)');
    words.push(`reltol=${spiceNumber(settings.relativeTolerance)}`);
  }
  return `.options ${words.join(' ')}`;
}

/** `.save all @q1[gm] …` for every transistor of the stage, before an `.op` card that asks for device figures. */
function saveCard(options: NetlistOptions, transistorNames: readonly string[]): string[] {
  if (options.analysis !== 'op' || !options.transistorVectors?.length) return [];
  const vectors = transistorNames.flatMap((name) => options.transistorVectors!.map((vector) => `@${name.toLowerCase()}[${vector}]`));
  return [`.save all ${vectors.join(' ')}`];
}

function analysisCard(options: NetlistOptions): string {
  switch (options.analysis) {
    case 'op':
      return '.op';
    case 'dc-differential': {
      const { startV, stopV, stepV } = options;
      // a falling sweep (stopV < startV) takes a negative step
      if (!(Number.isFinite(startV) && Number.isFinite(stopV) && Number.isFinite(stepV) && stepV !== 0 && Math.sign(stopV - startV) !== -Math.sign(stepV))) {
        throw new RangeError('DC sweep needs finite startV and stopV and a non-zero stepV towards stopV');
      }
      return `.dc ${DIFFERENTIAL_SOURCE} ${spiceNumber(startV)} ${spiceNumber(stopV)} ${spiceNumber(stepV)}`;
    }
    case 'tran-step': {
      const { stepS, stopS } = options;
      if (!(stepS > 0 && stopS > stepS && Number.isFinite(stopS))) throw new RangeError('transient needs 0 < stepS < stopS');
      // the step is also the largest internal step: a fast edge is never stepped over
      return `.tran ${spiceNumber(stepS)} ${spiceNumber(stopS)} 0 ${spiceNumber(stepS)}`;
    }
    default: {
      const { startHz, stopHz, pointsPerDecade } = options;
      if (!(startHz > 0 && stopHz >= startHz && Number.isInteger(pointsPerDecade) && pointsPerDecade >= 1)) {
        throw new RangeError(`AC sweep needs 0 < startHz <= stopHz and an integer pointsPerDecade >= 1`);
      }
      const sweep = `dec ${pointsPerDecade} ${spiceNumber(startHz)} ${spiceNumber(stopHz)}`;
      return options.analysis === 'noise' ? `.noise v(c1,c2) ${DIFFERENTIAL_SOURCE} ${sweep}` : `.ac ${sweep}`;
    }
  }
}

/**
 * The split differential drive: VCM at the common mode, VD (its DC and AC words as given), and
 * EIN1/EIN2 putting +v(VD)/2 and −v(VD)/2 over the common mode on the drive nodes.
 */
function splitDriveLines(commonModeV: number, driveNodes: readonly [string, string], differentialWords: string): string[] {
  const [in1, in2] = driveNodes;
  const [e1, e2] = SPLIT_SOURCES;
  return [
    '* one differential source VD, split symmetrically: v(in1) - v(in2) = v(VD)',
    dcSource(COMMON_MODE_SOURCE, 'vcm', commonModeV),
    `${DIFFERENTIAL_SOURCE} vd ${GROUND} ${differentialWords}`,
    `${e1} ${in1} vcm vd ${GROUND} 0.5`,
    `${e2} ${in2} vcm vd ${GROUND} -0.5`,
  ];
}

/** Input-drive lines for the analysis: in1/in2 at the common-mode DC voltage, or the tail test source. */
function inputDriveLines(options: NetlistOptions, commonModeV: number, driveNodes: readonly [string, string]): string[] {
  const [in1, in2] = driveNodes;
  const [vin1, vin2] = INPUT_SOURCES;
  switch (options.analysis) {
    case 'op': {
      const halfV = finite('differentialInputV', options.differentialInputV ?? 0) / 2;
      const offset = halfV !== 0 ? ['* an offset input: v(in1) - v(in2) = differentialInputV'] : [];
      return [...offset, dcSource(vin1, in1, commonModeV + halfV), dcSource(vin2, in2, commonModeV - halfV)];
    }
    case 'ac-rail':
      return [dcSource(vin1, in1, commonModeV), dcSource(vin2, in2, commonModeV)];
    case 'dc-differential':
      return splitDriveLines(commonModeV, driveNodes, 'DC 0');
    case 'noise':
      return splitDriveLines(commonModeV, driveNodes, 'DC 0 AC 1 0');
    case 'tran-step': {
      const { fromV, toV, delayS, stopS } = options;
      const edgeS = options.edgeS ?? STEP_EDGE_S;
      if (!(edgeS > 0 && delayS >= 0)) throw new RangeError('step needs edgeS > 0 and delayS >= 0');
      // PULSE(v1 v2 delay rise fall width period): one rising edge held to the end of the run
      const pulse = `DC ${spiceNumber(finite('fromV', fromV))} PULSE(${spiceNumber(fromV)} ${spiceNumber(finite('toV', toV))} ${spiceNumber(delayS)} ${spiceNumber(edgeS)} ${spiceNumber(edgeS)} ${spiceNumber(2 * stopS)} ${spiceNumber(4 * stopS)})`;
      return splitDriveLines(commonModeV, driveNodes, pulse);
    }
    case 'ac-differential':
      return [
        '* v(in1) - v(in2) = 1, split symmetrically',
        dcSource(vin1, in1, commonModeV, ' AC 0.5 0'),
        dcSource(vin2, in2, commonModeV, ' AC 0.5 180'),
      ];
    case 'ac-common-mode':
      return ['* both bases driven together, v_cm = 1', dcSource(vin1, in1, commonModeV, ' AC 1 0'), dcSource(vin2, in2, commonModeV, ' AC 1 0')];
    case 'ac-tail':
      return [
        '* no pair: the tail node is held at its operating-point voltage; Rout = 1/|i(vtail)|',
        dcSource(TAIL_TEST_SOURCE, TAIL_NODE, options.tailNodeV, ' AC 1 0'),
      ];
  }
}

/** The AC words of a rail's source: AC 1 on the rail an `ac-rail` netlist drives. */
function railAc(options: NetlistOptions, rail: keyof typeof RAIL_NODES): string {
  return options.analysis === 'ac-rail' && options.rail === rail ? ' AC 1 0' : '';
}

/** The comment prefix of every header line; never `*#` (ngspice reads `*#` lines as commands). */
const COMMENT_PREFIX = '* ';

/**
 * SPICE3 netlist of a design for one analysis. Sections: title, the header `comments`, supplies
 * (VP on vp, VN on vn), input drive, pair and loads, tail element, one `.model` card,
 * `.options tnom [reltol]`, `.temp`, the analysis card, `.end`. Every transistor has four
 * terminals, the substrate at the negative rail (`Qname c b e vn QNPN`); area factors are
 * written only when ≠ 1.
 *
 * The title line and every line but the comments are the writer's own. `comments` may hold user
 * text (a spec title, a device name, a library card): each entry is written as comment lines
 * only, one per line of its text, every control character, line or paragraph separator and
 * bidi control replaced (`shared/text/plain-text.ts`), so no text can become a card
 * (`.control`, `.include`, `shell`) of the file.
 */
export function spiceNetlist(design: Design, options: NetlistOptions, comments: readonly string[] = []): string {
  const circuit = stageCircuit(design);
  const temperatureC = design.temperatureC ?? NOMINAL_TEMPERATURE_C;
  const includePair = options.analysis !== 'ac-tail';
  const stageKind = stageFamily(design);
  const line = (element: CircuitElement): string => elementLine(element, stageKind);
  const pairLines = circuit.elements.filter((element) => element.part === 'pair').map(line);
  const tailLines = circuit.elements.filter((element) => element.part === 'tail').map(line);
  const lines = [
    `Longtail differential pair, ${design.tail.topology} tail (${options.analysis})`,
    ...comments.flatMap((text) => commentLines(text, COMMENT_PREFIX)),
    '* --- supplies ---',
    dcSource(SUPPLY_SOURCES.positive, RAIL_NODES.positive, circuit.fixedNodesV[RAIL_NODES.positive], railAc(options, 'positive')),
    dcSource(SUPPLY_SOURCES.negative, RAIL_NODES.negative, circuit.fixedNodesV[RAIL_NODES.negative], railAc(options, 'negative')),
    '* --- input drive ---',
    ...inputDriveLines(options, circuit.fixedNodesV[circuit.driveNodes[0]], circuit.driveNodes),
    '* --- pair and loads ---',
    ...(includePair ? pairLines : ['* (left out: the tail element is analysed alone)']),
    `* --- tail element (${design.tail.topology}) ---`,
    ...tailLines,
    '* --- device model and conditions ---',
    ...modelCards(design, circuit.elements, options),
    optionsCard(options),
    `.temp ${spiceNumber(temperatureC)}`,
    '* --- analysis ---',
    ...saveCard(
      options,
      // only an `op` netlist saves device figures, and it always holds the pair
      circuit.elements.filter(isTransistor).map((element) => element.name),
    ),
    analysisCard(options),
    '.end',
  ];
  return `${lines.join('\n')}\n`;
}

/** An element line read back from a netlist. Names and nodes as written (SPICE is case-insensitive). */
export type ParsedElement =
  | { kind: 'R'; name: string; nodes: [string, string]; valueOhm: number }
  | { kind: 'C'; name: string; nodes: [string, string]; valueF: number }
  | { kind: 'V'; name: string; nodes: [string, string]; dcV: number; acMagnitude: number; acPhaseDeg: number }
  | { kind: 'Q'; name: string; collector: string; base: string; emitter: string; substrate?: string; model: string; area: number };

/** Logical lines: comments dropped (`*` lines, `;` inline), `+` continuations joined, title skipped. */
function logicalLines(text: string): string[] {
  // Stryker disable next-line ArrayDeclaration: equivalent, a first line that is no element card is skipped by the reader
  const lines: string[] = [];
  text.split(/\r?\n/).forEach((raw, index) => {
    if (index === 0) return; // the title line
    const line = raw.replace(/;.*/, '').trim();
    if (line === '' || line.startsWith('*')) return;
    if (line.startsWith('+')) {
      // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent, a continuation with no line before it is dropped either way (lines[-1] is no element)
      if (lines.length > 0) lines[lines.length - 1] += ` ${line.slice(1)}`;
    } else lines.push(line);
  });
  return lines;
}

const NUMBER_START = /^[-+.\d]/;

function parseVoltageSource(name: string, tokens: string[]): ParsedElement {
  const nodes: [string, string] = [tokens[1], tokens[2]];
  const rest = tokens.slice(3);
  const numberAt = (index: number): number | undefined =>
    rest[index] !== undefined && NUMBER_START.test(rest[index]) ? parseSpiceNumber(rest[index]) : undefined;
  let dcV = numberAt(0) ?? 0;
  let acMagnitude = 0;
  let acPhaseDeg = 0;
  rest.forEach((token, index) => {
    const word = token.toLowerCase();
    if (word === 'dc') dcV = numberAt(index + 1) ?? 0;
    if (word === 'ac') {
      acMagnitude = numberAt(index + 1) ?? 1;
      acPhaseDeg = numberAt(index + 1) === undefined ? 0 : (numberAt(index + 2) ?? 0);
    }
  });
  return { kind: 'V', name, nodes, dcV, acMagnitude, acPhaseDeg };
}

/** A token after the model name: an area factor, bare or `area=`. */
function isAreaToken(token: string): boolean {
  return NUMBER_START.test(token) || /^area=/i.test(token);
}

function parseTransistor(name: string, tokens: string[]): ParsedElement {
  // Four terminals when a fifth node precedes the model name (the token after it is a word, not an area)
  const fourTerminals = tokens.length >= 6 && !isAreaToken(tokens[5]);
  const [, collector, base, emitter] = tokens;
  const substrate = fourTerminals ? tokens[4] : undefined;
  const [model, ...rest] = tokens.slice(fourTerminals ? 5 : 4);
  let area = 1;
  for (const token of rest) {
    const keyed = /^area=(.+)$/i.exec(token);
    if (keyed) area = parseSpiceNumber(keyed[1]);
    else if (NUMBER_START.test(token)) area = parseSpiceNumber(token);
  }
  return substrate === undefined ? { kind: 'Q', name, collector, base, emitter, model, area } : { kind: 'Q', name, collector, base, emitter, substrate, model, area };
}

/**
 * Reads the R, C, V and Q element lines of a netlist (other lines and dot cards are skipped).
 * Handles comments, `;` inline comments, `+` continuations and scale suffixes. A Q line is read
 * as `Qname collector base emitter [substrate] model [area | area=value]`.
 */
export function parseNetlistElements(text: string): ParsedElement[] {
  const elements: ParsedElement[] = [];
  for (const line of logicalLines(text)) {
    const tokens = line.split(/\s+/);
    const name = tokens[0];
    switch (name[0].toUpperCase()) {
      case 'R':
        elements.push({ kind: 'R', name, nodes: [tokens[1], tokens[2]], valueOhm: parseSpiceNumber(tokens[3]) });
        break;
      case 'C':
        elements.push({ kind: 'C', name, nodes: [tokens[1], tokens[2]], valueF: parseSpiceNumber(tokens[3]) });
        break;
      case 'V':
        elements.push(parseVoltageSource(name, tokens));
        break;
      case 'Q':
        elements.push(parseTransistor(name, tokens));
        break;
    }
  }
  return elements;
}
