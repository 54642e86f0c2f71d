/**
 * Fields named as people read them: a JSON pointer ("/supply/positiveV") to its schema `title`
 * in running text ("the positive rail"), so messages never show internal paths; the path itself
 * stays in each issue's `path` for the UI to place the message.
 */
import designSchemaJson from '../schema/design.schema.json';
import mosDesignSchemaJson from '../schema/mos-design.schema.json';
import specSchemaJson from '../schema/spec.schema.json';

type SchemaNode = { title?: string; properties?: Record<string, SchemaNode> };

/** The schema `title` of the field at `pointer`, or undefined when the schema declares none. */
export function fieldTitle(schema: SchemaNode, pointer: string): string | undefined {
  let node: SchemaNode | undefined = schema;
  for (const segment of pointer.split('/').slice(1)) node = node?.properties?.[segment];
  return node?.title;
}

/** "Positive rail" -> "the positive rail"; titles starting with an acronym keep it ("the VBE at 1 mA"). */
function inRunningText(title: string): string {
  const lowered = /^[A-Z][a-z]/.test(title) ? `${title[0].toLowerCase()}${title.slice(1)}` : title;
  return `the ${lowered}`;
}

/** A spec field in running text ("the highest input common mode"); the pointer's last word when untitled. */
export function specFieldLabel(pointer: string): string {
  const title = fieldTitle(specSchemaJson as SchemaNode, pointer);
  return title ? inRunningText(title) : pointer.split('/').at(-1) ?? pointer;
}

/** A MOS design field in running text, as specFieldLabel. */
export function mosDesignFieldLabel(pointer: string): string {
  const title = fieldTitle(mosDesignSchemaJson as SchemaNode, pointer);
  return title ? inRunningText(title) : pointer.split('/').at(-1) ?? pointer;
}

/** A design field in running text, as specFieldLabel. */
export function designFieldLabel(pointer: string): string {
  const title = fieldTitle(designSchemaJson as SchemaNode, pointer);
  return title ? inRunningText(title) : pointer.split('/').at(-1) ?? pointer;
}
