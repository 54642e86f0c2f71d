/**
 * The server's 400 answer (`details: [{ path, message }]`) as rjsf's ErrorSchema, so each
 * message shows beside its field. Paths name the request body: "/payload/supply/negativeV" is
 * the form's supply.negativeV, "/title" the title; anything the form has no field for lands on
 * the nearest field above it, its remaining path spelled out in the message.
 */
import type { ErrorSchema } from '@rjsf/utils';
import type { ErrorDetail } from '../../../lib/api';
import { pointerSegments, propertySchema, type SchemaNode } from './schema-nodes';

/** Where a body path points in the form: the field path below the payload. */
function formSegments(path: string): string[] {
  const segments = pointerSegments(path.startsWith('?') ? '' : path);
  return segments[0] === 'payload' ? segments.slice(1) : segments;
}

/** "item 3", "foo": the part of a path the form has no field for, in words. */
function spelledOut(segments: readonly string[]): string {
  return segments.map((s) => (/^\d+$/.test(s) ? `item ${Number(s) + 1}` : `“${s}”`)).join(' › ');
}

/**
 * Maps server error details onto rjsf's ErrorSchema. With `schema`, errors are kept at fields
 * the schema declares (object properties); without it, every path segment is followed.
 */
export function serverErrorsToErrorSchema(details: readonly ErrorDetail[], schema?: SchemaNode): ErrorSchema {
  const root: ErrorSchema = {};
  for (const detail of details) {
    const segments = formSegments(detail.path);
    let node: ErrorSchema = root;
    let nodeSchema = schema;
    let depth = 0;
    for (; depth < segments.length; depth++) {
      const segment = segments[depth];
      if (schema) {
        const child = propertySchema(nodeSchema, segment);
        if (!child) break;
        nodeSchema = child;
      }
      const children = node as Record<string, ErrorSchema>;
      children[segment] ??= {};
      node = children[segment];
    }
    const rest = segments.slice(depth);
    const message = rest.length > 0 ? `${spelledOut(rest)}: ${detail.message}` : detail.message;
    (node.__errors ??= []).push(message);
  }
  return root;
}
