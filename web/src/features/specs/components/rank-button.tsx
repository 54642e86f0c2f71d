/**
 * "Rank tail options": asks the engine to size and rank every tail option of the spec's latest
 * saved version, says what is happening while it works, then opens the proposal.
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { paths } from '../../../config/paths';
import { ApiError } from '../../../lib/api';
import { rankSpec } from '../api/spec-queries';
import { specKeys, waitingKeys } from '../../../lib/query-keys';

export function RankButton({ specId, version, unsaved }: { specId: number; version: number; unsaved: boolean }) {
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const rank = useMutation({
    mutationFn: () => rankSpec(specId),
    onSuccess: async (proposal) => {
      await Promise.all([queryClient.invalidateQueries({ queryKey: specKeys.all }), queryClient.invalidateQueries({ queryKey: waitingKeys.all })]);
      navigate(paths.proposal.href(proposal.id));
    },
  });
  return (
    <div className="flex flex-col items-end gap-1">
      <Button onClick={() => rank.mutate()} disabled={rank.isPending} aria-describedby={`rank-note-${specId}`}>
        {rank.isPending ? 'Ranking…' : 'Rank tail options'}
      </Button>
      <p id={`rank-note-${specId}`} role="status" aria-live="polite" className="max-w-72 text-right text-xs text-ink-soft dark:text-night-ink-soft">
        {rank.isPending
          ? `Sizing every tail option of version ${version}, checking it against the rules and running Monte Carlo… this can take a few seconds.`
          : unsaved
            ? `Ranks version ${version} as saved; your unsaved edits are not included.`
            : `Ranks version ${version}.`}
      </p>
      {rank.isError && (
        <p role="alert" className="max-w-72 text-right text-xs text-short dark:text-short-bright">
          <span aria-hidden="true">✕ </span>
          {rank.error instanceof ApiError ? rank.error.message : 'The ranking could not be made.'}
        </p>
      )}
    </div>
  );
}
