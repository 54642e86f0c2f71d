import type { ReactNode } from 'react';
import { formatQuantity } from '../../../../../shared/units/format-quantity';
import { Verdict } from '../../../components/ui/verdict';
import type { Proposal } from '../../../lib/api-types';
import { formatDeviationPercent, formatFixed, formatMargin, formatSignificant, formatTargetDb } from '../../proposals/lib/figure-format';
import { optionRows, specTargets } from '../../proposals/lib/option-rows';

function Head({ children, left }: { children: ReactNode; left?: boolean }) {
  return (
    <th scope="col" className={left ? 'py-1 pr-2 text-left align-bottom font-medium' : 'px-1.5 py-1 text-right align-bottom font-medium'}>
      {children}
    </th>
  );
}

function Num({ children }: { children: ReactNode }) {
  return <td className="px-1.5 py-1.5 text-right whitespace-nowrap tabular-nums">{children ?? '—'}</td>;
}

const text = (value: number | null, format: (v: number) => string) => (value === null ? null : format(value));

/** Every ranked option in one table: rank, name, verdict, the rejection that matters, and the key predicted figures. */
export function RankedOptions({ proposal, decided }: { proposal: Proposal; decided: { topology: string; ownValues: boolean } | null }) {
  const result = proposal.result;
  const rows = optionRows(result);
  const targets = specTargets(result);
  const f = targets ? formatQuantity(targets.frequencyHz, 'Hz') : 'the spec frequency';
  const rejectionWords = targets?.differential ? 'differential, mismatch worst case' : 'single-ended, worst corner';
  const required = targets ? (targets.differential ? targets.requiredDb : targets.requiredDb + targets.marginDb) : null;
  const headroom = (row: (typeof rows)[number]) => {
    const margins = [row.icmLowMarginV, row.icmHighMarginV, row.swingMarginV].filter((m): m is number => m !== null);
    return margins.length === 0 ? null : Math.min(...margins);
  };
  return (
    <>
      <p className="mb-2 text-sm">{result.summary}</p>
      <div className="overflow-x-auto">
        <table className="w-full text-sm">
          <caption className="sr-only">Tail options in the engine&rsquo;s ranking order</caption>
          <thead className="text-xs text-ink-soft dark:text-night-ink-soft">
            <tr className="border-b border-rule dark:border-night-rule">
              <Head left>#</Head>
              <Head left>Tail</Head>
              <Head left>Verdict</Head>
              <Head>
                Rejection at {f}
                <span className="block font-normal">
                  {rejectionWords}
                  {required !== null && `, ≥ ${formatTargetDb(required)}`}
                </span>
              </Head>
              <Head>
                Tail |Z|
                <span className="block font-normal">at {f}</span>
              </Head>
              <Head>
                Gain
                <span className="block font-normal">{targets ? `target ${formatSignificant(targets.gainTarget)} V/V` : 'V/V'}</span>
              </Head>
              <Head>Tail current</Head>
              <Head>
                Power
                <span className="block font-normal">worst corner</span>
              </Head>
              <Head>
                Headroom
                <span className="block font-normal">smallest margin</span>
              </Head>
            </tr>
          </thead>
          <tbody>
            {result.options.map((option, i) => {
              const row = rows[i];
              const notes = [row.recommended && 'recommended', option.topology === decided?.topology && (decided.ownValues ? 'decided with own values' : 'decided')].filter(Boolean).join(', ');
              return (
                <tr key={option.topology} className="border-b border-rule/60 align-top dark:border-night-rule/60">
                  <td className="py-1.5 pr-2 tabular-nums">{option.rank}</td>
                  <th scope="row" className="py-1.5 pr-2 text-left font-medium">
                    <span className="whitespace-nowrap">{row.name}</span>
                    {notes && <span className="block text-xs font-normal text-ink-soft dark:text-night-ink-soft">{notes}</span>}
                  </th>
                  <td className="py-1.5 pr-2">
                    {row.unsolved ? <Verdict kind="undecided" label="Not solved" /> : row.passes ? <Verdict kind="holds" label="Passes" /> : <Verdict kind="short" label={`Fails · ${row.blockingShortCount} blocking`} />}
                  </td>
                  <Num>{text(option.rejectionDb, (v) => `${formatFixed(v, 1)} dB`)}</Num>
                  <Num>{text(row.tailImpedanceAtFrequencyOhm, (v) => formatQuantity(v, 'Ohm'))}</Num>
                  <Num>
                    {row.gain === null ? null : (
                      <>
                        {formatSignificant(row.gain)}
                        {row.gainErrorPercent !== null && <span className="block text-xs text-ink-soft dark:text-night-ink-soft">{formatDeviationPercent(row.gainErrorPercent)}</span>}
                      </>
                    )}
                  </Num>
                  <Num>{text(row.tailCurrentA, (v) => formatQuantity(v, 'A'))}</Num>
                  <Num>{text(row.powerWorstW, (v) => formatQuantity(v, 'W'))}</Num>
                  <Num>{text(headroom(row), (v) => formatMargin(v, 'V'))}</Num>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-xs text-ink-soft dark:text-night-ink-soft">
        Ranking: passing options first, then the tail impedance at {f} from highest, then the simpler. Headroom is the smallest of the input common-mode (low and high end) and output-swing
        margins; margins are + on the safe side.
      </p>
    </>
  );
}
