/**
 * The ranking table as CSV (RFC 4180: comma-separated, CRLF line ends, fields with commas or
 * quotes quoted; text never spans lines), SI units named in each header, for a reviewer's spreadsheet.
 * Figures carry the precision the ranking page shows: decibels and per cent to one decimal,
 * everything else to three significant digits (what formatQuantity prints); the engine's full
 * precision is in export.json.
 */
import type { RecommendResult } from '../engine/recommend';
import { tailFieldsOf, tailRatio, tailRatioFieldsOf, tailValueOhm, type TailDesign } from '../engine/topologies';
import { spreadsheetCell } from '../text/plain-text';

type Option = RecommendResult['options'][number];

/** A figure to `decimals` places, as the page shows dB and % ("101.8"); missing stays missing. */
export function toDecimals(value: number | null | undefined, decimals = 1): number | null | undefined {
  if (value === null || value === undefined || !Number.isFinite(value)) return value;
  return Number(value.toFixed(decimals)) || 0;
}

/** A figure to `digits` significant digits, as the page shows quantities ("2.32 kΩ" is 2320). */
export function toSignificant(value: number | null | undefined, digits = 3): number | null | undefined {
  if (value === null || value === undefined || !Number.isFinite(value)) return value;
  return Number(value.toPrecision(digits)) || 0;
}

const db = (value: number | null | undefined) => toDecimals(value, 1);
const sig = (value: number | null | undefined) => toSignificant(value, 3);

const COLUMNS: [header: string, value: (o: Option) => string | number | boolean | null | undefined][] = [
  ['rank', (o) => o.rank],
  ['topology', (o) => o.topology],
  // The stage's transistor type: "npn", or "pnp" for the mirror image fed from the other rail
  ['device_family', (o) => (o.design ? ((o.design.device as Partial<typeof o.design.device> | undefined)?.family ?? 'npn') : null)],
  ['passes', (o) => o.passes],
  ['recommended', () => null],
  ['tail_impedance_at_spec_frequency_ohm', (o) => sig(o.figures?.tailImpedanceAtFrequencyOhm)],
  ['tail_output_resistance_ohm', (o) => sig(o.predicted?.tailOutputResistanceOhm)],
  ['cmrr_single_ended_dc_db', (o) => db(o.predicted?.cmrrDb.singleEnded)],
  ['cmrr_single_ended_at_spec_frequency_worst_corner_db', (o) => db(o.figures?.cmrrAtFrequencyDb)],
  ['cmrr_differential_worst_case_db', (o) => db(o.figures?.cmrrDifferentialWorstCaseDb)],
  ['monte_carlo_yield_percent', (o) => db(o.figures?.monteCarloYieldPercent)],
  ['gain_v_per_v', (o) => sig(o.figures?.gainPredicted)],
  ['gain_target_v_per_v', (o) => o.figures?.gainTarget],
  ['tail_current_a', (o) => sig(o.predicted?.tailCurrentA)],
  ['power_worst_w', (o) => sig(o.figures?.powerWorstW)],
  ['icm_low_margin_v', (o) => sig(o.figures?.icmLowMarginV)],
  ['icm_high_margin_v', (o) => sig(o.figures?.icmHighMarginV)],
  ['swing_margin_v', (o) => sig(o.figures?.swingMarginV)],
  ['collector_resistance_ohm', (o) => o.design?.collectorResistanceOhm],
  ['pair_emitter_resistance_ohm', (o) => o.design?.pairEmitterResistanceOhm ?? 0],
  ['tail_values', (o) => (o.design ? tailValues(o.design.tail) : null)],
  ['blocking_checks_short', (o) => o.checks.filter((c) => !c.passed && c.severity === 'blocking').map((c) => c.rule).join(' ')],
  ['advisory_checks_not_met', (o) => o.checks.filter((c) => !c.passed && c.severity === 'advisory').map((c) => c.rule).join(' ')],
  ['rejection_limits_at_spec_frequency_percent', (o) => rejectionLimitShares(o)],
  // The spec's optional targets: the worst-corner figure each check judges and the limit, empty where the spec sets no such target
  ['noise_worst_v_per_rthz', (o) => sig(o.figures?.noiseVPerRtHz)],
  ['noise_limit_v_per_rthz', (o) => o.figures?.noiseMaxVPerRtHz],
  ['noise_frequency_hz', (o) => o.figures?.noiseFrequencyHz],
  ['input_bias_current_worst_a', (o) => sig(o.figures?.inputBiasCurrentWorstA)],
  ['input_bias_current_limit_a', (o) => o.figures?.inputBiasCurrentMaxA],
  ['offset_at_sigmas_v', (o) => sig(o.figures?.offsetAtSigmasV)],
  ['offset_worst_case_v', (o) => sig(o.figures?.offsetWorstCaseV)],
  ['offset_limit_v', (o) => o.figures?.offsetMaxV],
  ['offset_sigmas', (o) => o.figures?.offsetSigmas],
  ['offset_drift_at_sigmas_v_per_c', (o) => sig(o.figures?.offsetDriftAtSigmasVPerC)],
  ['offset_drift_limit_v_per_c', (o) => o.figures?.offsetDriftMaxVPerC],
  ['bandwidth_worst_hz', (o) => sig(o.figures?.bandwidthWorstHz)],
  ['bandwidth_limit_hz', (o) => o.figures?.bandwidthMinHz],
  ['slew_rate_worst_v_per_s', (o) => sig(o.figures?.slewRateWorstVPerS)],
  ['slew_rate_limit_v_per_s', (o) => o.figures?.slewRateMinVPerS],
  ['psrr_positive_worst_db', (o) => db(o.figures?.psrrPositiveDb)],
  ['psrr_positive_limit_db', (o) => o.figures?.psrrPositiveMinDb],
  ['psrr_negative_worst_db', (o) => db(o.figures?.psrrNegativeDb)],
  ['psrr_negative_limit_db', (o) => o.figures?.psrrNegativeMinDb],
  ['linear_input_range_worst_v', (o) => sig(o.figures?.linearInputRangeWorstV)],
  ['linear_input_range_limit_v', (o) => o.figures?.linearInputRangeMinV],
  // The tail-current window the option was sized in (empty without a bounding target)
  ['tail_current_window_low_a', (o) => sig(o.tailCurrentWindow?.lower?.currentA)],
  ['tail_current_window_high_a', (o) => sig(o.tailCurrentWindow?.upper?.currentA)],
  ['tail_current_window_empty', (o) => o.tailCurrentWindow?.empty],
  ['tail_current_set_by', (o) => o.tailCurrentWindow?.setBy],
];

/** What limits the rejection at the spec frequency: each part's share, largest first ("tail-base-collector=48.9 tail-wiring=36.5"). */
function rejectionLimitShares(o: Option): string | null {
  const limits = o.rejectionLimits?.limits;
  return limits ? limits.map((l) => `${l.part}=${toDecimals(l.sharePercent, 1)}`).join(' ') : null;
}

/**
 * The tail's values by their design field: resistors in ohms (the field names say so), then the
 * emitter-area ratios as plain numbers, the catalogue's default written out where the design
 * leaves one out ("emitterResistanceOhm=340 startupResistanceOhm=2940000 areaRatio=8 outputAreaRatio=1").
 */
function tailValues(tail: TailDesign): string {
  const resistors = tailFieldsOf(tail.topology).map((field) => `${field}=${String(tailValueOhm(tail, field))}`);
  const ratios = tailRatioFieldsOf(tail.topology).map((field) => `${field}=${String(tailRatio(tail, field))}`);
  return [...resistors, ...ratios].join(' ');
}

/**
 * One CSV field: numbers as JavaScript writes them (full precision); text as one line with every
 * control character blanked and a leading apostrophe where a spreadsheet would run it as a
 * formula (`spreadsheetCell`, shared/text/plain-text.ts), quoted when it must be.
 */
export function csvField(value: string | number | boolean | null | undefined): string {
  if (value === null || value === undefined) return '';
  const text = typeof value === 'string' ? spreadsheetCell(value) : String(value);
  return /[",]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The ranked options, one row each, in rank order, with a header row. */
export function rankingCsv(result: RecommendResult): string {
  const rows = [COLUMNS.map(([header]) => header)];
  for (const option of result.options) {
    rows.push(COLUMNS.map(([header, value]) => (header === 'recommended' ? String(option.topology === result.recommended) : csvField(value(option)))));
  }
  return `${rows.map((row) => row.join(',')).join('\r\n')}\r\n`;
}
