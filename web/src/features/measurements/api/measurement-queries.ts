/**
 * Bench measurements of a proposal: a page of the list (metadata and comparison, from the
 * server, no points), one measurement with its points on demand, and the upload (multipart: the
 * CSV in `file`, an optional `note`); the list is fetched again after an upload.
 */
import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { MeasurementSummary, MeasurementView } from '#shared/measurements/types';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { Page } from '#shared/api/lists';
import { proposalKeys } from '../../../lib/query-keys';

/** Measurements a page of the panel shows. */
export const MEASUREMENT_PAGE_SIZE = 10;
/** The largest page the server gives (and more than a proposal keeps): the report asks for every measurement at once. */
export const MEASUREMENT_MAX_PAGE_SIZE = 100;

export const measurementKeys = {
  /** Under the proposal's own key, so refreshing a proposal refreshes its measurements too. */
  all: (proposalId: number) => [...proposalKeys.detail(proposalId), 'measurements'] as const,
  list: (proposalId: number, page: number, pageSize: number) => [...measurementKeys.all(proposalId), 'list', page, pageSize] as const,
  detail: (proposalId: number, measurementId: number) => [...measurementKeys.all(proposalId), 'detail', measurementId] as const,
};

export const measurementsQuery = (proposalId: number, page = 1, pageSize = MEASUREMENT_PAGE_SIZE) =>
  queryOptions({
    queryKey: measurementKeys.list(proposalId, page, pageSize),
    queryFn: () => apiClient.get<Page<MeasurementSummary>>(api.measurements(proposalId, `?${new URLSearchParams({ page: String(page), pageSize: String(pageSize) })}`)),
    placeholderData: keepPreviousData,
  });

/** One measurement with its points (fetched when it is plotted; the points never change). */
export const measurementQuery = (proposalId: number, measurementId: number) =>
  queryOptions({ queryKey: measurementKeys.detail(proposalId, measurementId), queryFn: () => apiClient.get<MeasurementView>(api.measurement(proposalId, measurementId)), staleTime: Infinity });

export function uploadMeasurement(proposalId: number, file: File, note: string): Promise<MeasurementView> {
  const form = new FormData();
  if (note.trim() !== '') form.append('note', note.trim());
  form.append('file', file, file.name);
  return apiClient.upload<MeasurementView>(api.measurements(proposalId), form);
}

/** The upload as a mutation; resolves once the list (and the audit trail) is fetched again. The answer, with its points, seeds that measurement's query. */
export function useUploadMeasurement(proposalId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ file, note }: { file: File; note: string }) => uploadMeasurement(proposalId, file, note),
    onSuccess: (stored) => {
      queryClient.setQueryData(measurementKeys.detail(proposalId, stored.id), stored);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: [...measurementKeys.all(proposalId), 'list'] }),
        queryClient.invalidateQueries({ queryKey: proposalKeys.audit(proposalId) }),
      ]);
    },
  });
}
