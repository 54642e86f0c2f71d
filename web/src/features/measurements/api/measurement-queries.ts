/**
 * Bench measurements of a proposal: the list (each with its comparison, from the server) and the
 * upload (multipart: the CSV in `file`, an optional `note`); the list is fetched again after an upload.
 */
import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { MeasurementView } from '../../../../../shared/measurements/types';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { Items } from '../../../lib/api-types';
import { proposalKeys } from '../../proposals/api/proposal-queries';

export const measurementKeys = {
  /** Under the proposal's own key, so refreshing a proposal refreshes its measurements too. */
  list: (proposalId: number) => [...proposalKeys.detail(proposalId), 'measurements'] as const,
};

export const measurementsQuery = (proposalId: number) =>
  queryOptions({ queryKey: measurementKeys.list(proposalId), queryFn: () => apiClient.get<Items<MeasurementView>>(api.measurements(proposalId)) });

export function uploadMeasurement(proposalId: number, file: File, note: string): Promise<MeasurementView> {
  const form = new FormData();
  if (note.trim() !== '') form.append('note', note.trim());
  form.append('file', file, file.name);
  return apiClient.upload<MeasurementView>(api.measurements(proposalId), form);
}

/** The upload as a mutation; resolves once the list (and the audit trail) is fetched again. */
export function useUploadMeasurement(proposalId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ file, note }: { file: File; note: string }) => uploadMeasurement(proposalId, file, note),
    onSuccess: () =>
      Promise.all([queryClient.invalidateQueries({ queryKey: measurementKeys.list(proposalId) }), queryClient.invalidateQueries({ queryKey: proposalKeys.audit(proposalId) })]),
  });
}
