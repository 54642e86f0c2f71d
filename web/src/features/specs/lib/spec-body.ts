import type { SpecInput } from '#shared/api/specs';
import type { SpecDraft } from '../components/spec-form';

/** The request body for a form's document: the title (also inside the document) and the document. */
export function specBody(draft: SpecDraft): SpecInput {
  return { title: typeof draft.title === 'string' ? draft.title : '', payload: draft };
}
