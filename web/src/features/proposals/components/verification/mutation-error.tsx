import { ApiError } from '../../../../lib/api';

/** Why a request for SPICE work was refused, in the server's words (a 409 says why the option cannot be simulated so). */
export function MutationError({ error, what }: { error: Error; what: string }) {
  const refused = error instanceof ApiError && error.status === 409;
  return (
    <div role="alert" className="rounded-md border border-short/40 bg-short-soft p-3 text-sm text-short dark:bg-short/20 dark:text-short-bright">
      <p className="font-medium">
        <span aria-hidden="true" className="mr-1.5">
          ✕
        </span>
        {refused ? `${what}: the server refused it` : what}
      </p>
      <p className="mt-1 text-ink dark:text-night-ink">{error.message}</p>
    </div>
  );
}
