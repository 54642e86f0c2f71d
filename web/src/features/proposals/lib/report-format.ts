/** Text for the report: the SPICE comparison's differences and tolerances. Pure. */
import type { VerifiedFigure } from '../../../../../shared/verification/types';
import { formatQuantity } from '../../../../../shared/units/format-quantity';
import { formatFigure } from '../../../lib/figure-format';

const MINUS = '\u2212';

/** The unit a verified figure's value prints with ("" means a plain ratio). */
const unitOf = (figure: Pick<VerifiedFigure, 'unit'>) => (figure.unit === '' ? '1' : figure.unit);

/** A predicted or simulated value with its unit; an em dash when missing. */
export function verifiedValue(value: number | null, figure: Pick<VerifiedFigure, 'unit'>): string {
  return value === null || !Number.isFinite(value) ? '—' : formatFigure(value, unitOf(figure), 4);
}

function signed(text: string, value: number): string {
  if (value === 0) return text;
  return `${value > 0 ? '+' : MINUS}${text}`;
}

/** predicted − simulated in the delta's own unit: "+1.2 %", "−0.4 dB", "+12 mV"; an em dash when missing. */
export function deltaText(figure: Pick<VerifiedFigure, 'delta' | 'deltaKind'>): string {
  const { delta } = figure;
  if (delta === null || !Number.isFinite(delta)) return '—';
  const magnitude = Math.abs(delta);
  if (figure.deltaKind === 'percent') return signed(`${magnitude.toFixed(1)} %`, Number(magnitude.toFixed(1)) === 0 ? 0 : delta);
  if (figure.deltaKind === 'db') return signed(`${magnitude.toFixed(2)} dB`, Number(magnitude.toFixed(2)) === 0 ? 0 : delta);
  return signed(formatQuantity(magnitude, 'V'), delta);
}

/** The tolerance a delta is held to: "±3 %", "±1.5 dB", "±50 mV". */
export function toleranceText(figure: Pick<VerifiedFigure, 'tolerance' | 'deltaKind'>): string {
  if (figure.deltaKind === 'percent') return `±${figure.tolerance} %`;
  if (figure.deltaKind === 'db') return `±${figure.tolerance} dB`;
  return `±${formatQuantity(figure.tolerance, 'V')}`;
}
