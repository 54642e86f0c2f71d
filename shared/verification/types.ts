/**
 * SPICE verification of a proposal: what the server stores and the app shows. Pure types and the
 * documented tolerances; the runner lives in `api/verification/`.
 *
 * A verification job re-simulates every option of a proposal (and a designer's override, when the
 * latest decision is one) in ngspice with the netlist the product exports, and sets each simulated
 * figure beside the engine's prediction. A Monte Carlo job simulates one option N times with the
 * spec's tolerances.
 */

import type { DesignBinding } from './binding';
import type { DifferenceCause } from './causes';

/** Job kinds: the whole proposal, or SPICE Monte Carlo on one option. */
export type VerificationKind = 'proposal' | 'monte-carlo';

/**
 * Job states. `waiting`: queued behind other jobs; `simulating`: being run now; `finished`: every
 * option was attempted (an option may still carry its own error); `stopped`: the server stopped
 * while the job ran (it can be asked for again); `failed`: the job itself could not run;
 * `withdrawn`: a person called it off while it waited or ran (its requester, a reviewer or an
 * administrator; it can be asked for again).
 */
export const VERIFICATION_STATES = ['waiting', 'simulating', 'finished', 'stopped', 'failed', 'withdrawn'] as const;
export type VerificationState = (typeof VERIFICATION_STATES)[number];

/** States after which a job never changes again. */
export const SETTLED_VERIFICATION_STATES: readonly VerificationState[] = ['finished', 'stopped', 'failed', 'withdrawn'];

/** States of a job that still takes (or will take) the simulator. */
export const ACTIVE_VERIFICATION_STATES = ['waiting', 'simulating'] as const;

/**
 * How much of the shared simulator one person may hold: jobs waiting or simulating at once, over
 * every project. Asking for more answers 429 until one settles or is withdrawn. Six covers a
 * Monte Carlo of each option of a proposal; the queue's round-robin keeps everyone else's work
 * moving either way.
 */
export const MAX_ACTIVE_JOBS_PER_PERSON = 6;

/**
 * How a figure's difference is expressed: relative (% of the simulated value), absolute dB, or
 * absolute in the figure's own unit (`absolute`: offset voltage and drift, whose tolerance is a
 * percentage with a floor, so it is stated in the unit and worked out per figure).
 */
export type DeltaKind = 'percent' | 'db' | 'absolute';

/**
 * Agreement tolerances between the engine and ngspice (the engine's issue; DEVELOPERS.md,
 * "Agreement with SPICE"). Percent figures are relative to the simulated value.
 */
export const VERIFICATION_TOLERANCES = {
  currentPercent: 3,
  gainPercent: 5,
  singleEndedCmrrDb: 1.5,
  differentialCmrrDb: 2,
  tailOutputResistancePercent: 20,
  cornerFrequencyPercent: 20,
  powerPercent: 5,
  /** Node voltages (collector, tail node): absolute, in volts. */
  voltageV: 0.05,
  /** The trade-off figures (ENGINE-CONTRACT.md, version 2 "New outputs"), the contract's tolerances. */
  biasCurrentPercent: 3,
  offsetCurrentPercent: 3,
  /** Offset voltage: 3 % of ngspice's, or 20 µV, whichever is larger. */
  offsetVoltagePercent: 3,
  offsetVoltageFloorV: 20e-6,
  /** Offset drift: 5 % of ngspice's, or 0.1 µV/°C, whichever is larger. */
  offsetDriftPercent: 5,
  offsetDriftFloorVPerC: 0.1e-6,
  noiseDensityPercent: 5,
  bandwidthPercent: 10,
  slewRatePercent: 10,
  linearRangePercent: 5,
  psrrDb: 1.5,
  inputResistancePercent: 5,
} as const;

/**
 * Groups of the nominal figures, in the order the table shows them. Results stored before the
 * groups were recorded have none on their figures and are shown as one list.
 */
export const FIGURE_GROUPS = ['bias', 'gain', 'input', 'supply', 'speed'] as const;
export type FigureGroup = (typeof FIGURE_GROUPS)[number];

/**
 * Why a figure has no verdict although it was (or could have been) simulated:
 * - `not-predicted`: the stored prediction lacks it (made by an engine version before the figure
 *   existed, or with no frequency to predict it at); the simulated value is shown alone, never a
 *   value the engine would give now.
 * - `matched-pair`: the design's pair has no mismatch, so the figure is zero by symmetry in both
 *   the engine and SPICE and nothing is simulated; the spread is the Monte Carlo's.
 */
export type NotCompared = 'not-predicted' | 'matched-pair';

/** One figure, predicted and simulated. */
export interface VerifiedFigure {
  /** Stable key, e.g. `tailCurrentA`, `cmrrSingleEndedDb`. */
  key: string;
  /** Readable name, e.g. "Tail current". */
  label: string;
  /** SI unit symbol for formatting (`A`, `V`, `Ohm`, `Hz`, `W`, `dB`, `` for ratios). */
  unit: string;
  predicted: number | null;
  simulated: number | null;
  /** predicted − simulated, as a percentage of |simulated| (`percent`), in dB (`db`), volts (`volts`) or the figure's unit (`absolute`). */
  delta: number | null;
  deltaKind: DeltaKind | 'volts';
  /** The tolerance the delta is held to, in the delta's own unit. */
  tolerance: number;
  /** How the tolerance was set when it is more than one number, e.g. "3 % of ngspice's, at least 20 µV". Absent otherwise. */
  toleranceBasis?: string;
  /** Where the figure sits in the nominal table (absent on older results and at the corners). */
  group?: FigureGroup;
  /** Why the figure has no verdict although it is listed (absent when it was compared, and on older results). */
  notCompared?: NotCompared;
  /** null when either side is missing (e.g. no corner below the sweep's end). */
  agrees: boolean | null;
  /** When it does not agree: the likely cause (shared/verification/causes.ts). Absent on older results. */
  cause?: DifferenceCause;
}

/** Figures at one operating condition (nominal, or a corner of input common mode × temperature). */
export interface VerifiedCondition {
  label: string;
  inputCommonModeV: number;
  temperatureC: number;
  figures: VerifiedFigure[];
}

/** One point of the rejection-against-frequency comparison (single-ended CMRR at nominal). */
export interface RejectionPoint {
  frequencyHz: number;
  simulatedDb: number;
  /** The engine's curve at the same frequency when it has one (its curve stops at 10 MHz). */
  predictedDb: number | null;
}

/** The verification of one option or of an override. */
export interface OptionVerification {
  topology: string;
  /** `option`: a ranked option; `decision`: the latest decision's own design (an override). */
  source: 'option' | 'decision';
  /** `verified`: simulated (figures may or may not agree); `error`: simulation failed, see `error`. */
  outcome: 'verified' | 'error';
  /** Why the simulation failed, in words (non-convergence, time limit, ngspice's message). */
  error: string | null;
  nominal: VerifiedCondition | null;
  corners: VerifiedCondition[];
  rejectionCurve: RejectionPoint[];
  /** Every figure with a verdict agrees. */
  agrees: boolean;
  /** Count of figures outside tolerance. */
  disagreements: number;
  elapsedMs: number;
  /**
   * The library card simulated with the design, when its spec was filled from one and the design
   * is still the card's device: its name and the parameters SPICE simulated that the engine does
   * not model. Absent when no card was simulated (and on older results).
   */
  card?: { name: string; spiceOnlyParameters: string[] };
  /**
   * What was simulated: the design's values, spec version, engine and rule set, and their
   * fingerprint (`binding.ts`). Absent on results stored before fingerprints were recorded.
   */
  binding?: DesignBinding;
}

export interface ProposalVerificationResult {
  /** ngspice's banner version, e.g. "ngspice-45". */
  simulator: string;
  /** The tolerances the job held figures to (results stored before the trade-off figures lack theirs). */
  tolerances: Partial<Record<keyof typeof VERIFICATION_TOLERANCES, number>>;
  options: OptionVerification[];
  /** Time spent starting the simulator for this job (0 when it was already running), ms. */
  simulatorStartMs: number;
  elapsedMs: number;
}

/** SPICE Monte Carlo of one option's rejection. */
export interface MonteCarloVerificationResult {
  simulator: string;
  topology: string;
  /** `option`: a ranked option; `decision`: the latest decision's design (own values included). Absent on older results (a ranked option). */
  source?: 'option' | 'decision';
  /** What was simulated (see OptionVerification.binding); absent on older results. */
  binding?: DesignBinding;
  /** Which rejection is drawn: the differential output's CMRR (mismatch-limited). */
  figure: 'cmrr-differential';
  /** The condition simulated: the corner that governs the option's mismatch worst case, e.g. "ICM −1.5 V, 65 °C". */
  condition: string;
  runs: number;
  seed: number;
  requiredDb: number;
  /** Runs that did not converge or failed (left out of the statistics). */
  failedRuns: number;
  /** Simulated rejection of each successful run at the spec frequency, dB (sorted ascending). */
  simulatedDb: number[];
  simulated: { yieldPercent: number; percentilesDb: { p1: number; p5: number; p50: number; p95: number } };
  /** The engine's closed-form Monte Carlo on the same draws. */
  predictedDb: number[];
  predicted: { yieldPercent: number; percentilesDb: { p1: number; p5: number; p50: number; p95: number } };
  /** Shared bin edges for overlaying both histograms, dB; counts per bin for each. */
  histogram: { binEdgesDb: number[]; simulatedCounts: number[]; predictedCounts: number[] };
  /** Each run's input offset voltage and their spread, beside the engine's statistical offset when it stores one. Absent on older results. */
  offset?: MonteCarloOffset;
  elapsedMs: number;
}

/**
 * The input offset voltage of the Monte Carlo's circuits: each run's zero of v(c1,c2) in a `.dc`
 * sweep of the differential drive (at the option's nominal condition, with that run's draws), and
 * the spread of those offsets beside the engine's stored statistical offset.
 */
export interface MonteCarloOffset {
  /** The condition the offsets were simulated at (the design's nominal one), e.g. "ICM 0 V, 27 °C". */
  condition: string;
  /** How many standard deviations the spec's offset target is read at (its `sigmas`, default 3). */
  sigmas: number;
  /** Runs whose offset could not be found (left out of the statistics). */
  failedRuns: number;
  /** Each successful run's offset, V (sorted ascending, rounded to 1 nV). */
  simulatedV: number[];
  simulated: { meanV: number; standardDeviationV: number; atSigmasV: number };
  /**
   * The engine's stored statistical offset for this option (its standard deviation and the value
   * at `sigmas`), or null when the stored option carries none (`predictedAbsent` says why).
   */
  predicted: { standardDeviationV: number | null; atSigmasV: number | null } | null;
  predictedAbsent: string | null;
}

/** A job as the API returns it. */
export interface VerificationJobView {
  id: number;
  proposalId: number;
  kind: VerificationKind;
  /** Monte Carlo: the option's topology; else null. */
  topology: string | null;
  /** Monte Carlo: a ranked option, or the latest decision's design (own values included). */
  source: 'option' | 'decision';
  /** Monte Carlo: the number of runs asked for; else null. */
  runs: number | null;
  state: VerificationState;
  done: number;
  total: number;
  /** What is being simulated now, e.g. "Wilson mirror: corner ICM −2 V, 85 °C". */
  step: string | null;
  /** Job-level failure, interruption or withdrawal (who called it off), in words. */
  message: string | null;
  requestedBy: { id: number; displayName: string };
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  /** Present once finished. */
  result: ProposalVerificationResult | MonteCarloVerificationResult | null;
}

/**
 * How the verification stands for the current design: `current` when a finished job simulated
 * exactly it (`jobId`), `stale` when the only results about it simulated something else
 * (`changes` says what), `unbound` when they were stored before fingerprints were recorded,
 * `none` when nothing about it was simulated.
 */
export interface DesignVerificationState {
  state: 'current' | 'stale' | 'unbound' | 'none';
  /** The job whose result is about the current design (current, stale or unbound); null for `none`. */
  jobId: number | null;
  changes: string[];
}

/** `GET /api/proposals/:id/verification`. */
export interface VerificationStatus {
  /** The verification of the proposal's current design (absent only when it has none). */
  currentDesign?: DesignVerificationState;
  /** The latest whole-proposal job, or null if none was asked for. */
  verification: VerificationJobView | null;
  /** The latest Monte Carlo job for each option that had one, newest first. */
  monteCarlo: VerificationJobView[];
}

/** Monte Carlo runs: default and limits. */
export const MONTE_CARLO_RUNS = { default: 200, min: 10, max: 2000 } as const;
