/** Walking the spec JSON Schema by property path (plain objects; no $ref in the spec schema). */

export type SchemaNode = Record<string, unknown>;

const isNode = (value: unknown): value is SchemaNode => typeof value === 'object' && value !== null && !Array.isArray(value);

/** The schema of a named property of an object schema, if it declares one. */
export function propertySchema(node: SchemaNode | undefined, name: string): SchemaNode | undefined {
  const properties = node?.properties;
  if (!isNode(properties)) return undefined;
  const child = properties[name];
  return isNode(child) ? child : undefined;
}

/** The schema at a path of property names and array indexes, if the schema reaches that far. */
export function schemaAt(root: SchemaNode | undefined, segments: readonly string[]): SchemaNode | undefined {
  let node = root;
  for (const segment of segments) {
    if (!node) return undefined;
    node = node.type === 'array' ? (isNode(node.items) ? node.items : undefined) : propertySchema(node, segment);
  }
  return node;
}

/** The segments of a JSON pointer ("/supply/negativeV" -> ["supply", "negativeV"]), unescaped (RFC 6901). */
export function pointerSegments(pointer: string): string[] {
  if (pointer === '' || pointer === '/') return [];
  return pointer
    .replace(/^\//, '')
    .split('/')
    .map((s) => s.replace(/~1/g, '/').replace(/~0/g, '~'));
}
