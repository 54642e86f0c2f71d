/**
 * Why the engine and SPICE may differ on a figure, when they differ beyond the tolerance: the
 * likely cause found by the verification run, as figures (which parameters, which transistors),
 * and its words. The tolerances stay the bar on what the engine models; a cause only says where
 * to look.
 *
 * - `spice-only-parameters`: the library card carries parameters SPICE simulates and the engine
 *   does not model (`SPICE_ONLY_PARAMETERS` of shared/devices/model-card.ts), and at least one of
 *   them moves a figure of this kind (operating point and low frequency, or at a frequency).
 * - `saturation`: in SPICE's operating point at this condition a transistor's base-collector
 *   junction is forward-biased (saturated or at its edge): there a figure moves steeply with
 *   small differences in the operating point.
 * - `unexplained`: neither; the engine models everything simulated here, so the difference is the
 *   engine's own and outside what its contract promises.
 */
import { formatSignedQuantity } from '../units/figures';

/** A transistor found saturated in SPICE's operating point: its name and VBC there, volts. */
export interface SaturatedTransistor {
  name: string;
  vbcV: number;
}

export type DifferenceCause =
  | { kind: 'spice-only-parameters'; parameters: string[]; saturated: SaturatedTransistor[] }
  | { kind: 'saturation'; parameters: []; saturated: SaturatedTransistor[] }
  | { kind: 'unexplained'; parameters: []; saturated: [] };

/** Which figures a parameter that changes only the charges can move: those read at a frequency. */
export type FigureKind = 'dc' | 'ac';

/**
 * The likely cause of a difference on a figure of `kind`, from the SPICE-only parameters
 * simulated (`moves(name, kind)` says whether one can move such a figure) and the transistors
 * found saturated at that condition.
 */
export function likelyCause(
  kind: FigureKind,
  spiceOnly: readonly string[],
  moves: (name: string, kind: FigureKind) => boolean,
  saturated: readonly SaturatedTransistor[],
): DifferenceCause {
  const parameters = spiceOnly.filter((name) => moves(name, kind));
  if (parameters.length > 0) return { kind: 'spice-only-parameters', parameters, saturated: [...saturated] };
  if (saturated.length > 0) return { kind: 'saturation', parameters: [], saturated: [...saturated] };
  return { kind: 'unexplained', parameters: [], saturated: [] };
}

const names = (list: readonly string[]) => (list.length > 6 ? `${list.slice(0, 6).join(', ')} and ${list.length - 6} more` : list.join(', '));

function saturatedText(saturated: readonly SaturatedTransistor[]): string {
  const shown = saturated.map((t) => `${t.name} (VBC ${formatSignedQuantity(t.vbcV, 'V')})`);
  return names(shown);
}

/** The cause in words, for the verification table and the report. */
export function causeText(cause: DifferenceCause): string {
  switch (cause.kind) {
    case 'spice-only-parameters': {
      const also = cause.saturated.length > 0 ? ` SPICE also finds ${saturatedText(cause.saturated)} saturated here.` : '';
      return `Likely the card's ${names(cause.parameters)}: SPICE simulates ${cause.parameters.length === 1 ? 'it' : 'them'}, the engine does not model ${cause.parameters.length === 1 ? 'it' : 'them'}.${also}`;
    }
    case 'saturation':
      return `Likely saturation: SPICE finds ${saturatedText(cause.saturated)} with the base-collector junction forward-biased here, where figures move steeply with small differences in the operating point.`;
    case 'unexplained':
      return 'No parameter the engine leaves out and no saturated transistor explains it: the engine models everything simulated here, so this is a difference in the engine itself; report it.';
  }
}
