import { queryOptions } from '@tanstack/react-query';
import type { RJSFSchema } from '@rjsf/utils';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { Items } from '#shared/api/lists';
import type { Proposal } from '#shared/api/proposals';
import type { SpecDiff, SpecInput, SpecVersion, SpecWithLatest } from '#shared/api/specs';
import { specKeys } from '../../../lib/query-keys';

/** The spec JSON Schema the server serves; it drives the form. It changes only with a release. */
export const specSchemaQuery = () => queryOptions({ queryKey: specKeys.schema(), queryFn: () => apiClient.get<RJSFSchema>(api.specSchema), staleTime: Infinity });

export const specQuery = (id: number) => queryOptions({ queryKey: specKeys.detail(id), queryFn: () => apiClient.get<SpecWithLatest>(api.spec(id)) });

export const specVersionsQuery = (id: number) =>
  queryOptions({ queryKey: specKeys.versions(id), queryFn: () => apiClient.get<Items<SpecVersion>>(api.specVersions(id)) });

/** Field-by-field changes between two versions; versions never change, so neither does the answer. */
export const specDiffQuery = (id: number, from: number, to: number) =>
  queryOptions({ queryKey: specKeys.diff(id, from, to), queryFn: () => apiClient.get<SpecDiff>(api.specDiff(id, from, to)), staleTime: Infinity });


export function createSpec(projectId: number, body: SpecInput): Promise<SpecWithLatest> {
  return apiClient.post<SpecWithLatest>(api.projectSpecs(projectId), body);
}

/** Saves the document as the spec's next version; an unchanged document answers `unchanged: true` and writes nothing. */
export function saveSpecVersion(specId: number, body: SpecInput): Promise<SpecWithLatest> {
  return apiClient.put<SpecWithLatest>(api.spec(specId), body);
}

/** Asks the engine to size and rank every tail option of the spec's latest version. */
export function rankSpec(specId: number): Promise<Proposal> {
  return apiClient.post<Proposal>(api.specProposals(specId));
}
