import { useQueryClient } from '@tanstack/react-query';
import { ApiError } from '../../../../lib/api';
import type { FieldKey } from './design-fields';
import { fieldKeyOfPath } from './override-draft';
import { proposalKeys } from '../../../../lib/query-keys';

export type ServerErrors = Partial<Record<FieldKey | 'reason' | 'topology', string>>;

/** Why the decision was not recorded, in place; for a 409, a way to see what changed meanwhile. */
export function SubmitError({ error, proposalId }: { error: Error; proposalId: number }) {
  const queryClient = useQueryClient();
  const status = error instanceof ApiError ? error.status : 0;
  const unplaced = error instanceof ApiError && status === 400 ? error.details.filter((d) => d.path !== '/reason' && d.path !== '/topology' && !fieldKeyOfPath(d.path)) : [];
  const title = status === 409 ? 'The proposal cannot take this decision now' : status === 400 ? 'The server refused the decision: see the marked fields' : 'The decision was not recorded';
  return (
    <div role="alert" className="rounded-md border border-short/40 bg-short-soft p-3 text-sm text-short dark:bg-short/20 dark:text-short-bright">
      <p className="font-medium">{title}</p>
      <p className="mt-1">{error.message}</p>
      {unplaced.length > 0 && (
        <ul className="mt-1 list-inside list-disc">
          {unplaced.map((d) => (
            <li key={`${d.path}${d.message}`}>
              <code>{d.path || '(request)'}</code>: {d.message}
            </li>
          ))}
        </ul>
      )}
      <p className="mt-1 text-xs">Your choice, values and reason are still here.</p>
      {status === 409 && (
        <button type="button" className="mt-1 text-xs font-medium underline" onClick={() => void queryClient.invalidateQueries({ queryKey: proposalKeys.detail(proposalId) })}>
          Show the proposal as it is now (discards this unsent decision)
        </button>
      )}
    </div>
  );
}

/** A refused decision's field messages (400 with paths), by field; nothing for other errors. */
export function serverErrorsOf(error: unknown): ServerErrors {
  if (!(error instanceof ApiError) || error.status !== 400) return {};
  const errors: ServerErrors = {};
  for (const { path, message } of error.details) {
    if (path === '/reason') errors.reason = `The server says: ${message}`;
    else if (path === '/topology') errors.topology = `The server says: ${message}`;
    else {
      const key = fieldKeyOfPath(path);
      if (key) errors[key] = `The server says: ${message}`;
    }
  }
  return errors;
}
