import type { Design } from '#shared/engine/types';
import { Quantity } from '../../../../components/ui/quantity';
import { fieldValue, fieldsFor } from './design-fields';
import { topologyName } from '../../../../lib/topology-names';

/** A design's resistor values, each beside the ranked option's when they differ. */
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
              <Quantity value={value} unit={info.unit} digits={4} />
              {ranked !== undefined && ranked !== value && (
                <span className="ml-2 text-xs text-ink-soft dark:text-night-ink-soft">
                  (ranked <Quantity value={ranked} unit={info.unit} digits={4} />)
                </span>
              )}
            </dd>
          </div>
        );
      })}
    </dl>
  );
}
