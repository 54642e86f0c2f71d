/**
 * A project's device library: a page of its cards (by name, optionally those whose name
 * contains a text; or its removed and replaced cards), what a spec's recorded card resolves to,
 * and the writes (upload a file of cards, replace one card's text, remove a card); each write
 * fetches the library again.
 */
import type { DeviceModelView, RecordedDeviceModel } from '../../../../../shared/devices/types';
import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { Items, Page } from '../../../lib/api-types';
import { projectKeys } from '../../projects/api/project-queries';

/** One card of a project's device library (GET /api/projects/:id/devices). */
export type LibraryDevice = DeviceModelView;
export type { RecordedDeviceModel };

/** Cards a page of the library panel shows. */
export const DEVICE_PAGE_SIZE = 20;
/** The largest page the server gives: the spec form's picker lists this many matches of its filter. */
export const DEVICE_PICKER_PAGE_SIZE = 100;

export interface DeviceListParams {
  page: number;
  pageSize: number;
  /** Names containing this (case-insensitive); empty: every card. */
  q: string;
  /** `library`: the cards specs can be filled from; `former`: removed and replaced ones. */
  state: 'library' | 'former';
}

export const deviceKeys = {
  all: (projectId: number) => [...projectKeys.detail(projectId), 'devices'] as const,
  list: (projectId: number, params: DeviceListParams) => [...deviceKeys.all(projectId), 'list', params] as const,
  recorded: (projectId: number, name: string, checksum: string) => [...deviceKeys.all(projectId), 'recorded', name.toLowerCase(), checksum] as const,
};

export const projectDevicesQuery = (projectId: number, params: Partial<DeviceListParams> = {}) => {
  const full: DeviceListParams = { page: 1, pageSize: DEVICE_PAGE_SIZE, q: '', state: 'library', ...params };
  const query = new URLSearchParams({ page: String(full.page), pageSize: String(full.pageSize), state: full.state });
  if (full.q.trim() !== '') query.set('q', full.q.trim());
  return queryOptions({
    queryKey: deviceKeys.list(projectId, full),
    queryFn: () => apiClient.get<Page<LibraryDevice>>(api.projectDevices(projectId, `?${query}`)),
    placeholderData: keepPreviousData,
  });
};

/** The card a spec recorded (`deviceModel { name, checksum }`), whatever its state, and the library's card of that name today. */
export const recordedDeviceQuery = (projectId: number, name: string, checksum: string) =>
  queryOptions({ queryKey: deviceKeys.recorded(projectId, name, checksum), queryFn: () => apiClient.get<RecordedDeviceModel>(api.recordedDevice(projectId, name, checksum)) });

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
