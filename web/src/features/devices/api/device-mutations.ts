/**
 * The writes to a project's device library (upload a file of cards, replace one card's text,
 * remove a card); each write fetches the library again. The reads are in lib/device-library.ts.
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { Items } from '#shared/api/lists';
import { deviceKeys, type LibraryDevice } from '../../../lib/device-library';

/** Uploads a text file of .model cards (multipart, field `file`); all of it is stored or none. */
export function uploadDeviceFile(projectId: number, file: File): Promise<Items<LibraryDevice>> {
  const form = new FormData();
  form.append('file', file, file.name);
  return apiClient.upload<Items<LibraryDevice>>(api.projectDevices(projectId), form);
}

/** Replaces a card's text with the one card of a file of the same name; the old text stays readable, marked replaced. */
export function replaceDevice(projectId: number, deviceId: number, file: File): Promise<{ item: LibraryDevice; replaced: LibraryDevice }> {
  const form = new FormData();
  form.append('file', file, file.name);
  return apiClient.upload<{ item: LibraryDevice; replaced: LibraryDevice }>(api.projectDevice(projectId, deviceId), form, 'PUT');
}

export function removeDevice(projectId: number, deviceId: number): Promise<void> {
  return apiClient.delete<void>(api.projectDevice(projectId, deviceId));
}

function useLibraryWrite<TVariables, TResult>(projectId: number, write: (variables: TVariables) => Promise<TResult>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: write, onSuccess: () => queryClient.invalidateQueries({ queryKey: deviceKeys.all(projectId) }) });
}

/** The upload as a mutation; resolves once the library is fetched again. */
export const useUploadDevices = (projectId: number) => useLibraryWrite(projectId, (file: File) => uploadDeviceFile(projectId, file));
export const useReplaceDevice = (projectId: number) => useLibraryWrite(projectId, ({ deviceId, file }: { deviceId: number; file: File }) => replaceDevice(projectId, deviceId, file));
export const useRemoveDevice = (projectId: number) => useLibraryWrite(projectId, (deviceId: number) => removeDevice(projectId, deviceId));
