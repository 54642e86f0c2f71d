/**
 * A project's device library as read by the library panel and the spec form's picker: a page of
 * its cards (by name, optionally those whose name contains a text; or its removed and replaced
 * cards) and what a spec's recorded card resolves to. The writes live with the library panel
 * (features/devices).
 */
import type { DeviceModelView, RecordedDeviceModel } from '#shared/devices/types';
import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { api } from '../config/paths';
import { apiClient } from './api';
import type { DeviceListQuery } from '#shared/api/devices';
import type { Page } from '#shared/api/lists';
import { projectKeys } from './query-keys';

/** One card of a project's device library (GET /api/projects/:id/devices). */
export type LibraryDevice = DeviceModelView;
export type { RecordedDeviceModel };

/** Cards a page of the library panel shows. */
export const DEVICE_PAGE_SIZE = 20;
/** The largest page the server gives: the spec form's picker lists this many matches of its filter. */
export const DEVICE_PICKER_PAGE_SIZE = 100;

/** The list's query as the panel keeps it: every field set (`q` empty for every card). */
export type DeviceListParams = Required<DeviceListQuery>;

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
