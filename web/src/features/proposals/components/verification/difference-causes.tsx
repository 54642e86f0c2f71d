import type { OptionVerification } from '#shared/verification/types';
import { causeText } from '#shared/verification/causes';
import { deltaText, toleranceText } from '../../lib/verification-format';

/**
 * What was simulated beyond the engine's model (the library card and the parameters SPICE alone
 * simulates), then every figure outside tolerance, nominal and at the corners, with its
 * difference and its likely cause. The tolerances stay the verdict; the cause says where to look.
 */
export function DifferenceCauses({ option, compact = false }: { option: OptionVerification; compact?: boolean }) {
  const conditions = [...(option.nominal ? [option.nominal] : []), ...option.corners];
  const outside = conditions.flatMap((condition) => condition.figures.filter((f) => f.agrees === false).map((figure) => ({ condition, figure })));
  const spiceOnly = option.card?.spiceOnlyParameters ?? [];
  const text = compact ? 'text-xs' : 'text-sm';
  if (!option.card && outside.length === 0) return null;
  return (
    <section aria-label="Differences beyond tolerance and their likely causes" className={`space-y-1 ${text}`} data-difference-causes>
      {option.card && (
        <p data-simulated-card>
          Simulated with every parameter of library card <span className="font-medium">{option.card.name}</span>
          {spiceOnly.length > 0 ? (
            <>
              ; the engine does not model its <span className="font-medium">{spiceOnly.join(', ')}</span>, so SPICE may differ where {spiceOnly.length === 1 ? 'it matters' : 'they matter'}.
            </>
          ) : (
            ', each of them modelled by the engine.'
          )}
        </p>
      )}
      {outside.length > 0 && (
        <>
          <h4 className={compact ? 'font-medium' : 'text-sm font-medium'}>Outside tolerance, with the likely cause</h4>
          <ul className="space-y-1.5">
            {outside.map(({ condition, figure }) => (
              <li key={`${condition.label}:${figure.key}`} className="border-l-2 border-short/60 pl-2 dark:border-short-bright/60">
                <span className="font-medium">{figure.label}</span>, {condition.label}: engine minus ngspice {deltaText(figure)} (tolerance {toleranceText(figure)}).
                {figure.cause && <span className="block text-ink-soft dark:text-night-ink-soft">{causeText(figure.cause)}</span>}
              </li>
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
