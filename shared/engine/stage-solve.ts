/**
 * Solving a design's operating point: the device at the design's temperature, the stage circuit
 * with its starting guess, every transistor's own model where the pair's BF or VAF differ, and a
 * differential DC input on the drive nodes when one is asked (offset and transfer searches).
 * `analyze` builds the small-signal stage and the figures on top (analyze.ts).
 */
import { stageCircuit, stageFamily, type StageCircuit } from './circuit';
import { NOMINAL_TEMPERATURE_C } from './constants';
import { withHardFields } from './convergence-hints';
import { deviceModel, forwardBeta, pnpDeviceOf, type DeviceModel } from './device';
import { hasModelCard, resolvedParameters } from './bjt-parameters';
import { ConvergenceError, solveOperatingPoint, type OperatingPoint } from './operating-point';
import type { Design } from './types';

/** The least current a starting-guess VBE is taken at, A. */
const GUESS_LEAST_CURRENT_A = 1e-9;

/** Starting-guess VBE: the device's VBE at a rough tail-current estimate (rails over the largest resistor). */
function vbeGuessV(design: Design, model: DeviceModel): number {
  const tail = design.tail;
  // the PTAT cell: about 3·VT (ln 20) over its resistor; every other tail: the rails over its largest resistor
  const roughA =
    tail.topology === 'ptat'
      ? (3 * model.thermalVoltageV) / tail.emitterResistanceOhm
      : (design.supply.positiveV - design.supply.negativeV) / (2 * (tail.topology === 'resistor' ? tail.resistanceOhm : tail.referenceResistanceOhm));
  const currentA = Math.max(roughA, GUESS_LEAST_CURRENT_A);
  return model.thermalVoltageV * Math.log(currentA / model.saturationCurrentA);
}

/** The device of a transistor whose BF or VAF is scaled (a mismatched pair transistor): BF and VAF times their scales. */
export function scaledDevice(device: Design['device'], betaScale = 1, earlyVoltageScale = 1): Design['device'] {
  if (device.model && hasModelCard(device)) {
    // A card: its BF and VAF scaled (VAF infinite stays infinite), every other parameter kept
    const { BF, VAF } = resolvedParameters(device.model);
    const model = { ...device.model, BF: BF * betaScale };
    if (Number.isFinite(VAF)) model.VAF = VAF * earlyVoltageScale;
    return { ...device, model, beta: undefined, earlyVoltageV: undefined };
  }
  const scaled = { ...device, beta: forwardBeta(device) * betaScale };
  // VAF = 0 reads as infinite (no Early effect): a mismatch of it changes nothing
  if (device.earlyVoltageV !== undefined && device.earlyVoltageV > 0) scaled.earlyVoltageV = device.earlyVoltageV * earlyVoltageScale;
  return scaled;
}

/**
 * Models of the transistors whose device differs from the stage's own (`device`, NPN or PNP by
 * its family): a mismatched pair transistor's BF or VAF, and an NPN stage's PNPs (`device.pnp`), by name.
 */
function ownTransistorModels(circuit: StageCircuit, design: Design, temperatureC: number): Record<string, DeviceModel> {
  const models: Record<string, DeviceModel> = {};
  const stageKind = stageFamily(design);
  let pnpModel: DeviceModel | undefined;
  for (const el of circuit.elements) {
    if (el.kind === stageKind && (el.betaScale !== undefined || el.earlyVoltageScale !== undefined)) {
      models[el.name] = deviceModel(scaledDevice(design.device, el.betaScale, el.earlyVoltageScale), temperatureC);
    } else if (el.kind === 'pnp' && stageKind === 'npn') {
      pnpModel ??= deviceModel(pnpDeviceOf(design), temperatureC);
      models[el.name] = pnpModel;
    }
  }
  return models;
}

/** A solved operating point with the device model it was solved with and the circuit's drive nodes. */
export interface SolvedOperatingPoint {
  model: DeviceModel;
  op: OperatingPoint;
  driveNodes: StageCircuit['driveNodes'];
}

/**
 * Solves a design's operating point with `differentialInputV` (V) between its drive nodes
 * (v(drive1) − v(drive2), split ± half over the common mode; 0 for the design as it is).
 * `warmStart`: a solved operating point of the same topology that seeds the Newton iteration.
 * A design that does not converge throws a ConvergenceError naming the fields that make it hard.
 */
export function solveStageOperatingPoint(design: Design, warmStart?: OperatingPoint, differentialInputV = 0): SolvedOperatingPoint {
  const temperatureC = design.temperatureC ?? NOMINAL_TEMPERATURE_C;
  const model = deviceModel(design.device, temperatureC);
  const vbeAtV = (currentA: number) => model.thermalVoltageV * Math.log(Math.max(currentA, GUESS_LEAST_CURRENT_A) / model.saturationCurrentA);
  const circuit = stageCircuit(design, vbeGuessV(design, model), vbeAtV, model.thermalVoltageV);
  if (differentialInputV !== 0) {
    const [drive1, drive2] = circuit.driveNodes;
    circuit.fixedNodesV[drive1] += differentialInputV / 2;
    circuit.fixedNodesV[drive2] -= differentialInputV / 2;
  }
  try {
    const op = solveOperatingPoint(circuit, model, warmStart, ownTransistorModels(circuit, design, temperatureC));
    return { model, op, driveNodes: circuit.driveNodes };
  } catch (error) {
    throw error instanceof ConvergenceError ? withHardFields(error, design) : error;
  }
}
