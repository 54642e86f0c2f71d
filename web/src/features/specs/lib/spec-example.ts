/**
 * A new spec starts from the schema's defaults (rjsf fills those in) plus a worked example for
 * the fields that have no default: the schema's own `examples` (±12 V rails, gain 100, 80 dB).
 */
import type { SchemaNode } from './schema-nodes';

/** The first `examples` entry of every property that has one, nested as the schema nests. */
export function exampleFromSchema(schema: SchemaNode): Record<string, unknown> {
  const properties = (schema.properties ?? {}) as Record<string, SchemaNode>;
  const example: Record<string, unknown> = {};
  for (const [name, node] of Object.entries(properties)) {
    if (node.type === 'object') {
      const inner = exampleFromSchema(node);
      if (Object.keys(inner).length > 0) example[name] = inner;
    } else if (Array.isArray(node.examples) && node.examples.length > 0) {
      example[name] = node.examples[0];
    }
  }
  return example;
}
