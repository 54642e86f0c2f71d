/**
 * The ranking (proposal) page's loader, apart from its route module so that the router can hold it
 * in the entry chunk: the proposal is asked for while the page's module is still loading, not
 * after. The spec schema is fetched only when the page shows it (a newer spec version's changes).
 */
import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { proposalQuery } from '../features/proposals/api/proposal-queries';
import { specSchemaQuery } from '../features/specs/api/spec-queries';

export const loader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const proposal = await queryClient.ensureQueryData(proposalQuery(Number(params.proposalId)));
    if (proposal.specMovedOn) await queryClient.ensureQueryData(specSchemaQuery());
    return null;
  };
