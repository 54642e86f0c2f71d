/**
 * The engine's public surface: pure functions, SI units, no I/O (ENGINE-CONTRACT.md).
 */
export { analyze, solveStage, transfersAt, singleEndedCmrrDbAt, type StageSolution } from './analyze';
export { evaluateDesign, recommend, type RecommendOption, type RecommendResult, type TailCurrentWindow } from './recommend';
export { stageCircuit, type StageCircuit, type CircuitElement } from './circuit';
export { InputError } from './errors';
export { ConvergenceError } from './operating-point';
export { ENGINE_VERSION, ESTIMATE_NOTICE } from './version';
export { thermalVoltageV } from './constants';
export { ENGINE_SOURCES, engineSource, type EngineSource } from './sources';
export * from './types';
export { outputRejection, REJECTION_KIND_WORDS, type OutputRejection, type RejectionKind } from './output-rejection';
