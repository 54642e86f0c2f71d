import type { ReactNode } from 'react';
import { formatQuantity } from '#shared/units/format-quantity';
import { OptionVerdict } from '../../../../components/ui/verdict';
import type { Proposal } from '#shared/api/proposals';
import { ColumnTitle } from '../ranking/column-title';
import { FigureCell } from '../ranking/figure-cell';
import { formatDeviationPercent, formatFixed, formatMargin, formatPercent, formatSignificant } from '#shared/units/figures';
import { optionRows, outputRejectionNote, rejectionColumns, specTargets } from '../../lib/option-rows';
import { formatTradeoff } from '../../lib/tradeoff-columns';

function Head({ children, left }: { children: ReactNode; left?: boolean }) {
  return (
    <th scope="col" className={left ? 'py-1 pr-1.5 text-left align-bottom font-medium' : 'px-1 py-1 text-right align-bottom font-medium [&_.whitespace-nowrap]:whitespace-normal'}>
      {children}
    </th>
  );
}

function Num({ children }: { children: ReactNode }) {
  return <td className="px-1 py-1.5 text-right whitespace-nowrap tabular-nums">{children}</td>;
}

const text = (value: number | null, format: (v: number) => string) => (value === null ? null : format(value));

/**
 * Every ranked option in one table, with the page's figures against the page's targets
 * (rejectionColumns and optionVerdictWords are the page's own): rank, name, verdict, the
 * rejection columns (● the one for the spec's output), tail impedance, gain, tail current, power,
 * the worst-corner figure of each target the spec sets, and the smallest headroom margin.
 */
export function RankedOptions({ proposal, decided }: { proposal: Proposal; decided: { topology: string; ownValues: boolean } | null }) {
  const result = proposal.result;
  const rows = optionRows(result);
  const targets = specTargets(result);
  const rejections = rejectionColumns(targets);
  const tradeoffs = targets?.tradeoffs ?? [];
  const f = targets ? formatQuantity(targets.frequencyHz, 'Hz') : 'the spec frequency';
  const note = outputRejectionNote(targets);
  const headroom = (row: (typeof rows)[number]) => {
    const margins = [row.icmLowMarginV, row.icmHighMarginV, row.swingMarginV].filter((m): m is number => m !== null);
    return margins.length === 0 ? null : Math.min(...margins);
  };
  // The page's word for the current design: signed off once approved, decided before.
  const decidedWord = proposal.status === 'approved' ? 'signed off' : 'decided';
  return (
    <>
      <p className="mb-2 text-sm">{result.summary}</p>
      <div className="relative overflow-x-auto" tabIndex={0} role="group" aria-label="Ranked options table (scrolls sideways on a narrow screen)">
        <table className="report-ranking w-full text-xs">
          <caption className="sr-only">Tail options in the engine&rsquo;s ranking order</caption>
          <thead className="text-ink-soft dark:text-night-ink-soft">
            <tr>
              <td colSpan={3} />
              <th scope="colgroup" colSpan={rejections.length} className="px-1.5 pt-1 text-center font-medium">
                <span className="block border-b border-rule pb-0.5 dark:border-night-rule">CM rejection, dB</span>
              </th>
              <td colSpan={4} />
              {tradeoffs.length > 0 && (
                <th scope="colgroup" colSpan={tradeoffs.length} className="px-1.5 pt-1 text-center font-medium">
                  <span className="block border-b border-rule pb-0.5 dark:border-night-rule">Spec targets, worst corner</span>
                </th>
              )}
              <td />
            </tr>
            <tr className="border-b border-rule dark:border-night-rule">
              <Head left>#</Head>
              <Head left>Tail</Head>
              <Head left>Verdict</Head>
              {rejections.map((c) => (
                <Head key={c.field}>
                  <ColumnTitle title={c.title} sub={c.sub} forOutput={c.forOutput} />
                </Head>
              ))}
              <Head>
                <ColumnTitle title="Tail |Z|" sub={`at ${f}`} />
              </Head>
              <Head>
                <ColumnTitle title="Gain V/V" sub={targets ? `${formatQuantity(targets.gainTarget, '1')} ±${formatPercent(targets.gainTolerancePercent)}` : undefined} />
              </Head>
              <Head>
                <ColumnTitle title="Tail current" sub="nominal" />
              </Head>
              <Head>
                <ColumnTitle title="Power" sub={targets ? `worst, ≤ ${formatQuantity(targets.powerBudgetW, 'W')}` : 'worst corner'} />
              </Head>
              {tradeoffs.map((c) => (
                <Head key={c.field}>
                  <ColumnTitle title={c.title} sub={c.sub} />
                </Head>
              ))}
              <Head>
                <ColumnTitle title="Headroom" sub="smallest margin" />
              </Head>
            </tr>
          </thead>
          <tbody>
            {result.options.map((option, i) => {
              const row = rows[i];
              const notes = [row.recommended && 'recommended', option.topology === decided?.topology && (decided.ownValues ? `${decidedWord} with own values` : decidedWord)].filter(Boolean).join(', ');
              return (
                <tr key={option.topology} className="border-b border-rule/60 align-top dark:border-night-rule/60">
                  <td className="py-1.5 pr-2 tabular-nums">{option.rank}</td>
                  <th scope="row" className="py-1.5 pr-1.5 text-left font-medium">
                    <span>{row.name}</span>
                    {notes && <span className="block text-xs font-normal text-ink-soft dark:text-night-ink-soft">{notes}</span>}
                  </th>
                  <td className="py-1.5 pr-1.5">
                    <OptionVerdict option={row} className="whitespace-normal" />
                  </td>
                  {rejections.map((c) => {
                    const value = row[c.field];
                    return (
                      <Num key={c.field}>
                        <FigureCell text={value === null ? null : c.unit === '%' ? formatFixed(value, 1).replace(/\.0$/, '') : formatFixed(value, 1)} standing={c.field === 'cmrrDcDb' ? undefined : row.standing[c.field]} />
                      </Num>
                    );
                  })}
                  <Num>
                    <FigureCell text={text(row.tailImpedanceAtFrequencyOhm, (v) => formatQuantity(v, 'Ohm'))} />
                  </Num>
                  <Num>
                    <FigureCell
                      text={text(row.gain, (v) => formatSignificant(v))}
                      standing={row.standing.gain}
                      extra={row.gainErrorPercent !== null && <span className="block text-ink-soft dark:text-night-ink-soft">{formatDeviationPercent(row.gainErrorPercent)}</span>}
                    />
                  </Num>
                  <Num>
                    <FigureCell text={text(row.tailCurrentA, (v) => formatQuantity(v, 'A'))} />
                  </Num>
                  <Num>
                    <FigureCell text={text(row.powerWorstW, (v) => formatQuantity(v, 'W'))} standing={row.standing.powerWorstW} />
                  </Num>
                  {tradeoffs.map((c) => (
                    <Num key={c.field}>
                      <FigureCell text={text(row[c.field], (v) => formatTradeoff(v, c.unit))} standing={row.standing[c.field]} />
                    </Num>
                  ))}
                  <Num>
                    <FigureCell text={text(headroom(row), (v) => formatMargin(v, 'V'))} />
                  </Num>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-xs text-ink-soft dark:text-night-ink-soft">
        {note && <>{note} </>}
        <span className="text-short dark:text-short-bright">✕</span> figure short of a blocking check, <span className="text-note dark:text-note-bright">!</span> advisory check not met.
        Ranking: passing options first, then the tail impedance at {f} from highest, then the simpler. Headroom is the smallest of the input common-mode (low and high end) and output-swing
        margins; margins are + on the safe side.
      </p>
    </>
  );
}
