/** The form's submit button with the words of the last save (progress, result) beside it. */
import type { SubmitButtonProps } from '@rjsf/utils';
import { getSubmitButtonOptions } from '@rjsf/utils';
import { Button } from '../ui/button';
import { formContextOf } from './form-context';

export function SubmitButton({ uiSchema, registry }: SubmitButtonProps) {
  const { submitText, norender, props } = getSubmitButtonOptions(uiSchema);
  const { submitNote } = formContextOf(registry);
  if (norender) return null;
  return (
    <div className="sticky bottom-0 -mx-1 mt-2 flex flex-wrap items-center gap-3 border-t border-rule bg-paper/95 px-1 py-3 dark:border-night-rule dark:bg-night/95">
      <Button type="submit" disabled={props?.disabled === true}>
        {submitText}
      </Button>
      <div role="status" aria-live="polite" className="text-sm text-ink-soft dark:text-night-ink-soft">
        {submitNote}
      </div>
    </div>
  );
}
