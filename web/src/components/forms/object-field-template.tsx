/**
 * Objects. The root lays its properties out as the uiSchema's `layout` asks: lead fields across
 * the top, then compact cards, each a titled group of fields; properties the layout does not
 * name land in a last card so nothing in the schema is ever hidden. A nested object is a
 * compact grid of its fields, named for screen readers by its schema title.
 */
import type { ObjectFieldTemplatePropertyType, ObjectFieldTemplateProps } from '@rjsf/utils';
import { getUiOptions, titleId } from '@rjsf/utils';
import { FormCard } from './form-card';

/** A card of the root layout: its title, an optional line under it, the properties it holds. */
export interface FormLayoutCard {
  title: string;
  note?: string;
  fields: readonly string[];
}

export interface FormLayout {
  lead: readonly string[];
  cards: readonly FormLayoutCard[];
}

const FIELD_GRID = 'grid grid-cols-1 gap-x-4 gap-y-3 sm:grid-cols-2';

export function ObjectFieldTemplate(props: ObjectFieldTemplateProps) {
  const layout = getUiOptions(props.uiSchema).layout as FormLayout | undefined;
  if (props.fieldPathId.path.length === 0 && layout) return <RootLayout {...props} layout={layout} />;
  const id = titleId(props.fieldPathId);
  return (
    <div role="group" aria-labelledby={id}>
      <span id={id} className="sr-only">
        {props.title}
      </span>
      <div className={FIELD_GRID}>{visible(props.properties).map((p) => p.content)}</div>
    </div>
  );
}

function visible(properties: ObjectFieldTemplatePropertyType[]): ObjectFieldTemplatePropertyType[] {
  return properties.filter((p) => !p.hidden);
}

function RootLayout({ properties, layout, fieldPathId }: ObjectFieldTemplateProps & { layout: FormLayout }) {
  const byName = new Map(properties.map((p) => [p.name, p]));
  const placed = new Set([...layout.lead, ...layout.cards.flatMap((c) => c.fields)]);
  const rest = properties.filter((p) => !placed.has(p.name));
  const cards = rest.length > 0 ? [...layout.cards, { title: 'Other', fields: rest.map((p) => p.name) }] : layout.cards;
  const pick = (names: readonly string[]) => names.map((n) => byName.get(n)).filter((p): p is ObjectFieldTemplatePropertyType => p !== undefined && !p.hidden);
  return (
    <div id={fieldPathId.$id}>
      <div className="mb-4">{pick(layout.lead).map((p) => p.content)}</div>
      <div className="gap-4 md:columns-2 xl:columns-3">
        {cards.map((card) => {
          const fields = pick(card.fields);
          if (fields.length === 0) return null;
          return (
            <FormCard key={card.title} title={card.title} note={card.note}>
              <div className={FIELD_GRID}>{fields.map((p) => p.content)}</div>
            </FormCard>
          );
        })}
      </div>
    </div>
  );
}
