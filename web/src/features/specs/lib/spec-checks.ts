/**
 * Checks the form adds to the schema's: text a quantity field cannot read (the form must not
 * submit it), and the server's cross-field rules (rails in order, input range inside the rails,
 * the current-gain spread around the nominal, an offset target with a limit), placed on the same
 * fields as the server places them, on the document the form would save (unset optional groups
 * left out).
 */
import type { FormValidation, RJSFValidationError } from '@rjsf/utils';
import type { Spec as SpecDocument } from '#shared/engine/types';
import { specCrossFieldIssues } from '#shared/validation/cross-field-rules';
import { pointerSegments } from './schema-nodes';
import { withoutEmptyCard } from './device-choice';
import { withoutUnsetGroups } from './optional-groups';

/** rjsf's field id ("root_supply_negativeV") as a property path; the spec's names have no "_". */
export function pathFromFieldId(id: string): string[] {
  return id.replace(/^root_?/, '').split('_').filter(Boolean);
}

/** Adds `message` at `segments`, creating the nodes rjsf did not (fields whose value is empty). */
export function addErrorAt(errors: FormValidation, segments: readonly string[], message: string): void {
  let node = errors as unknown as Record<string, unknown>;
  for (const segment of segments) {
    node[segment] ??= { __errors: [] };
    node = node[segment] as Record<string, unknown>;
  }
  ((node.__errors ??= []) as string[]).push(message);
}

const isNumber = (value: unknown) => typeof value === 'number' && Number.isFinite(value);

/** The cross-field rules assume a schema-valid document; they run once the numbers they compare are there. */
function crossFieldReady(doc: Record<string, unknown>): boolean {
  const at = (a: string, b?: string) => (b === undefined ? doc[a] : (doc[a] as Record<string, unknown> | undefined)?.[b]);
  return [at('supply', 'positiveV'), at('supply', 'negativeV'), at('inputCommonMode', 'minV'), at('inputCommonMode', 'maxV'), at('temperatureC', 'min'), at('temperatureC', 'max'), at('outputSwingVpp')].every(isNumber);
}

/** The form's customValidate: unreadable quantities, then the cross-field rules. */
export function specChecks(unreadable: ReadonlyMap<string, string>) {
  return (formData: Record<string, unknown> | undefined, errors: FormValidation): FormValidation => {
    for (const [id, message] of unreadable) addErrorAt(errors, pathFromFieldId(id), message);
    if (formData && crossFieldReady(formData)) {
      for (const issue of specCrossFieldIssues(withoutUnsetGroups(withoutEmptyCard(formData)) as unknown as SpecDocument)) addErrorAt(errors, pointerSegments(issue.path), issue.message);
    }
    return errors;
  };
}

/** Drops schema errors of fields whose text is unreadable ("is required"): the reading error says it. */
export function withoutUnreadableFieldErrors(unreadable: ReadonlyMap<string, string>) {
  return (errors: RJSFValidationError[]): RJSFValidationError[] =>
    errors.filter((e) => !unreadable.has(`root${(e.property ?? '').replace(/\./g, '_')}`));
}
