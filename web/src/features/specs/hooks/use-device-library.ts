/**
 * The device library as the spec form's picker sees it: one page of the project's cards (the
 * first DEVICE_PICKER_PAGE_SIZE whose name contains the filter typed in the picker), and the card
 * the spec records (`deviceModel`) resolved by the server to its exact text, whether it is still
 * in the library, replaced by a new text, or removed.
 */
import { useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { DEVICE_PICKER_PAGE_SIZE, projectDevicesQuery, recordedDeviceQuery } from '../../devices/api/device-queries';
import type { DeviceLibraryState, DeviceModelRef } from '../lib/device-choice';

const isChecksum = (value: string) => /^[0-9a-fA-F]{64}$/.test(value);

export function useDeviceLibrary(projectId: number | undefined, recordedRef: DeviceModelRef | undefined): DeviceLibraryState | undefined {
  const [filter, setFilter] = useState('');
  const enabled = projectId !== undefined;
  const page = useQuery({ ...projectDevicesQuery(projectId ?? 0, { q: filter, pageSize: DEVICE_PICKER_PAGE_SIZE }), enabled });
  const lookup = recordedRef && isChecksum(recordedRef.checksum) ? recordedRef : undefined;
  const recorded = useQuery({ ...recordedDeviceQuery(projectId ?? 0, lookup?.name ?? '', lookup?.checksum ?? ''), enabled: enabled && lookup !== undefined });
  return useMemo<DeviceLibraryState | undefined>(() => {
    if (!enabled) return undefined;
    const items = page.data?.items;
    const own = recorded.data?.recorded;
    return {
      // The recorded card joins the page's cards when the filter leaves it out, so the form can still read it.
      items: items && own && own.state === 'library' && !items.some((d) => d.id === own.id) ? [...items, own] : items,
      total: page.data?.total ?? 0,
      loading: page.isPending,
      error: page.error,
      filter,
      setFilter,
      recorded: lookup ? (recorded.data ?? (recorded.isPending ? 'loading' : null)) : null,
    };
  }, [enabled, page.data, page.isPending, page.error, recorded.data, recorded.isPending, filter, lookup]);
}
