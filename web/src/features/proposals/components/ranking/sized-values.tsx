import type { ReactNode } from 'react';
import { cardOf, resolvedParameters } from '#shared/engine/bjt-parameters';
import { TOPOLOGY_CATALOGUE } from '#shared/engine/topologies';
import type { Design, DeviceParams, ResistorSeries } from '#shared/engine/types';
import { formatQuantity } from '#shared/units/format-quantity';
import type { AnalyzeResult, OptionFacts } from '#shared/engine/types';
import { formatPercent, formatRatio } from '#shared/units/figures';
import { onSeries, sizedRatios, sizedResistors } from '../../lib/sized-values';

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

/** The tail's PNP transistors (`device.pnp`): current gain, Early voltage, IS, from its card when it has one. */
function PnpGroup({ pnp, names }: { pnp: NonNullable<DeviceParams['pnp']>; names: string[] }) {
  // The card the engine reads: the model card when given, else IS, BF and VAF (an Early voltage of 0 is infinite)
  const card = resolvedParameters(cardOf(pnp as DeviceParams));
  return (
    <Group title={`PNP transistors (${names.join(', ')})`}>
      <Row name="β (BF)" value={formatQuantity(card.BF, '1')} />
      <Row name="VAF" value={Number.isFinite(card.VAF) ? formatQuantity(card.VAF, 'V') : '∞'} note="Early voltage" />
      <Row name="IS" value={formatQuantity(card.IS, 'A')} note={pnp.saturationCurrentA === undefined && !pnp.model ? 'at 27 °C, from a VBE of 0.65 V at 1 mA' : 'at 27 °C'} />
    </Group>
  );
}

/** The option's sized values: resistors on the spec's series, the tail's emitter-area ratios, rails, operating point and the device. */
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
  const family = (d.family ?? 'npn').toUpperCase();
  const ratios = sizedRatios(design);
  const pnpNames = TOPOLOGY_CATALOGUE[design.tail.topology].transistors.filter((q) => q.type === 'pnp').map((q) => q.name);
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
      {ratios.length > 0 && (
        <Group title="Emitter-area ratios">
          {ratios.map((r) => (
            <Row key={r.name} name={r.name} value={formatRatio(r.ratio)} note={r.role} />
          ))}
        </Group>
      )}
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
      <Group title={pnpNames.length > 0 ? `${family} transistors (all alike)` : `Transistors (${family}, all alike)`}>
        <Row name="β (BF)" value={formatQuantity(resolvedParameters(cardOf(d)).BF, '1')} />
        <Row name="VAF" value={d.earlyVoltageV ? formatQuantity(d.earlyVoltageV, 'V') : '∞'} note="Early voltage" />
        {d.saturationCurrentA !== undefined && <Row name="IS" value={formatQuantity(d.saturationCurrentA, 'A')} note="at 27 °C" />}
        {d.vceSatV !== undefined && <Row name="VCE(sat)" value={formatQuantity(d.vceSatV, 'V')} />}
        {d.vbeMismatchSigmaV !== undefined && <Row name="σ(ΔVBE)" value={formatQuantity(d.vbeMismatchSigmaV, 'V')} note="pair mismatch, 1 σ" />}
      </Group>
      {pnpNames.length > 0 && d.pnp && <PnpGroup pnp={d.pnp} names={pnpNames} />}
    </table>
  );
}
