import type { ReactNode } from 'react';
import { cardOf, resolvedParameters } from '#shared/engine/bjt-parameters';
import type { Design, ResistorSeries } from '#shared/engine/types';
import { formatQuantity } from '#shared/units/format-quantity';
import type { AnalyzeResult, OptionFacts } from '#shared/engine/types';
import { formatPercent } from '#shared/units/figures';
import { onSeries, sizedResistors } from '../../lib/sized-values';

function Row({ name, value, note }: { name: string; value: string; note?: string }) {
  return (
    <tr className="border-t border-rule/60 dark:border-night-rule/60">
      <th scope="row" className="py-1 pr-3 text-left font-medium whitespace-nowrap">
        {name}
      </th>
      <td className="py-1 pr-3 text-right whitespace-nowrap tabular-nums">{value}</td>
      <td className="w-full py-1 text-xs text-ink-soft dark:text-night-ink-soft">{note}</td>
    </tr>
  );
}

function Group({ title, children }: { title: string; children: ReactNode }) {
  return (
    <tbody>
      <tr>
        <th colSpan={3} scope="colgroup" className="pt-3 pb-1 text-left text-xs font-medium tracking-wide text-ink-soft uppercase dark:text-night-ink-soft">
          {title}
        </th>
      </tr>
      {children}
    </tbody>
  );
}

/** The option's sized values: resistors on the spec's series, rails, operating point and the device. */
export function SizedValues({
  design,
  series,
  tolerancePercent,
  facts,
  predicted,
}: {
  design: Design;
  series: ResistorSeries | null;
  /** The spec's resistor tolerance in per cent (1 for ±1 %). */
  tolerancePercent: number | null;
  facts: OptionFacts | null;
  predicted: AnalyzeResult | null;
}) {
  const d = design.device;
  const seriesNote = (valueOhm: number) =>
    series === null ? undefined : onSeries(valueOhm, series) ? `${series}${tolerancePercent ? `, ±${formatPercent(tolerancePercent).replace(' ', '\u00a0')}` : ''}` : `not on ${series}`;
  return (
    <table className="w-full text-sm">
      <caption className="sr-only">Sized values of this option</caption>
      <Group title="Resistors">
        {sizedResistors(design).map((r) => (
          <Row key={r.names.join()} name={r.names.join(', ')} value={formatQuantity(r.valueOhm, 'Ohm')} note={`${r.role} · ${seriesNote(r.valueOhm) ?? ''}`.replace(/ · $/, '')} />
        ))}
      </Group>
      <Group title="Rails and bias">
        <Row name="V+" value={formatQuantity(design.supply.positiveV, 'V')} />
        <Row name="V−" value={formatQuantity(design.supply.negativeV, 'V')} note={design.supply.negativeV === 0 ? 'single supply' : undefined} />
        <Row name="Input common mode" value={formatQuantity(design.inputCommonModeV ?? 0, 'V')} note="nominal, both bases" />
        <Row name="Tail capacitance" value={formatQuantity(design.tailCapacitanceF ?? 0, 'F')} note="t to AC ground" />
      </Group>
      {predicted && (
        <Group title="Operating point (nominal)">
          <Row name="Tail current" value={formatQuantity(predicted.tailCurrentA, 'A')} note={predicted.referenceCurrentA > 0 ? `reference branch ${formatQuantity(predicted.referenceCurrentA, 'A')}` : undefined} />
          <Row name="IC per side" value={formatQuantity(predicted.collectorCurrentA, 'A')} note={`gm ${formatQuantity(predicted.transconductanceS, 'S')}`} />
          <Row name="V(c1)" value={formatQuantity(predicted.collectorVoltageV, 'V')} note="collector of Q1" />
          <Row name="V(t)" value={formatQuantity(predicted.tailNodeVoltageV, 'V')} note="tail node" />
          {facts && <Row name="Tail Rout" value={formatQuantity(facts.tailOutputResistanceOhm, 'Ohm')} note={facts.tailOutputResistanceNote} />}
        </Group>
      )}
      <Group title={`Transistors (${(d.family ?? 'npn').toUpperCase()}, all alike)`}>
        <Row name="β (BF)" value={formatQuantity(resolvedParameters(cardOf(d)).BF, '1')} />
        <Row name="VAF" value={d.earlyVoltageV ? formatQuantity(d.earlyVoltageV, 'V') : '∞'} note="Early voltage" />
        {d.saturationCurrentA !== undefined && <Row name="IS" value={formatQuantity(d.saturationCurrentA, 'A')} note="at 27 °C" />}
        {d.vceSatV !== undefined && <Row name="VCE(sat)" value={formatQuantity(d.vceSatV, 'V')} />}
        {d.vbeMismatchSigmaV !== undefined && <Row name="σ(ΔVBE)" value={formatQuantity(d.vbeMismatchSigmaV, 'V')} note="pair mismatch, 1 σ" />}
      </Group>
    </table>
  );
}
