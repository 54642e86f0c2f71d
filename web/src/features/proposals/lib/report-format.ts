/** Text for the report: the SPICE comparison's differences and tolerances. Pure. */
import type { VerifiedFigure } from '#shared/verification/types';
import { formatDb, formatFigure, formatPercent, formatSignedQuantity, formatTolerance } from '#shared/units/figures';

/** The unit a verified figure's value prints with ("" means a plain ratio). */
const unitOf = (figure: { unit?: string }) => (!figure.unit ? '1' : figure.unit);

/** A predicted or simulated value with its unit; an em dash when missing. */
export function verifiedValue(value: number | null, figure: Pick<VerifiedFigure, 'unit'>): string {
  return value === null || !Number.isFinite(value) ? '—' : formatFigure(value, unitOf(figure), 4);
}

/** predicted − simulated in the delta's own unit: "+1.2 %", "−0.4 dB", "+12 mV"; an em dash when missing. */
export function deltaText(figure: Pick<VerifiedFigure, 'delta' | 'deltaKind'> & { unit?: string }): string {
  const { delta } = figure;
  if (delta === null || !Number.isFinite(delta)) return '—';
  if (figure.deltaKind === 'percent') return formatPercent(delta, { sign: 'exceptZero', trimZeros: false });
  if (figure.deltaKind === 'db') return formatDb(delta, { sign: 'exceptZero', decimals: 2 });
  return formatSignedQuantity(delta, figure.deltaKind === 'absolute' ? unitOf(figure) : 'V');
}

/** The tolerance a delta is held to: "±3 %", "±1.5 dB", "±50 mV". */
export function toleranceText(figure: Pick<VerifiedFigure, 'tolerance' | 'deltaKind'> & { unit?: string }): string {
  return formatTolerance(figure.tolerance, figure.deltaKind === 'percent' ? '%' : figure.deltaKind === 'db' ? 'dB' : figure.deltaKind === 'absolute' ? unitOf(figure) : 'V');
}
