import type { DeviceModelView } from '../../../../../shared/devices/types';
import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { Items } from '../../../lib/api-types';
import { projectKeys } from '../../projects/api/project-queries';

/** One card of a project's device library (GET /api/projects/:id/devices). */
export type LibraryDevice = DeviceModelView;

export const deviceKeys = {
  library: (projectId: number) => [...projectKeys.detail(projectId), 'devices'] as const,
};

export const projectDevicesQuery = (projectId: number) =>
  queryOptions({ queryKey: deviceKeys.library(projectId), queryFn: () => apiClient.get<Items<LibraryDevice>>(api.projectDevices(projectId)) });

/** Uploads a text file of .model cards (multipart, field `file`); all of it is stored or none. */
export function uploadDeviceFile(projectId: number, file: File): Promise<Items<LibraryDevice>> {
  const form = new FormData();
  form.append('file', file, file.name);
  return apiClient.upload<Items<LibraryDevice>>(api.projectDevices(projectId), form);
}

/** The upload as a mutation; resolves once the library is fetched again. */
export function useUploadDevices(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => uploadDeviceFile(projectId, file),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: deviceKeys.library(projectId) }),
  });
}
