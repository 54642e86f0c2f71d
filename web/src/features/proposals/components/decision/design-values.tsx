import type { Design } from '#shared/engine/types';
import { Quantity } from '../../../../components/ui/quantity';
import { fieldText, fieldValue, fieldsFor, type FieldInfo } from './design-fields';
import { topologyName } from '../../../../lib/topology-names';

/** A design's value of one field: a quantity ("4.7 kΩ"), or a ratio as a plain ratio ("8×"). */
function FieldValue({ info, value }: { info: FieldInfo; value: number | undefined }) {
  if (info.kind === 'ratio' && value !== undefined) return <span className="tabular-nums whitespace-nowrap">{fieldText(info, value, 4)}</span>;
  return <Quantity value={value} unit={info.unit} digits={4} />;
}

/** A design's resistor values and area ratios, each beside the ranked option's when they differ. */
export function DesignValues({ design, compareWith }: { design: Design; compareWith?: Design | null }) {
  const fields = fieldsFor(design.tail.topology);
  return (
    <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
      <dt className="text-ink-soft dark:text-night-ink-soft">Tail topology</dt>
      <dd>{topologyName(design.tail.topology)}</dd>
      {fields.map((info) => {
        const value = fieldValue(design, info.key);
        const ranked = compareWith && compareWith.tail.topology === design.tail.topology ? fieldValue(compareWith, info.key) : undefined;
        return (
          <div key={info.key} className="contents">
            <dt className="text-ink-soft dark:text-night-ink-soft">{info.title}</dt>
            <dd>
              <FieldValue info={info} value={value} />
              {ranked !== undefined && ranked !== value && (
                <span className="ml-2 text-xs text-ink-soft dark:text-night-ink-soft">
                  (ranked <FieldValue info={info} value={ranked} />)
                </span>
              )}
            </dd>
          </div>
        );
      })}
    </dl>
  );
}
