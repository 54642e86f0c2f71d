/**
 * The device library as the spec form's picker sees it: one page of the project's cards (the
 * first DEVICE_PICKER_PAGE_SIZE whose name contains the filter typed in the picker), and the card
 * the spec records (`deviceModel`) resolved by the server to its exact text, whether it is still
 * in the library, replaced by a new text, or removed.
 */
import { useQuery } from '@tanstack/react-query';
import { useEffect, useMemo, useState } from 'react';
import { DEVICE_PICKER_PAGE_SIZE, projectDevicesQuery, recordedDeviceQuery } from '../../../lib/device-library';
import { libraryDeviceFor, type DeviceLibraryState, type DeviceModelRef } from '../lib/device-choice';

const SEARCH_PAUSE_MS = 250;

const isChecksum = (value: string) => /^[0-9a-fA-F]{64}$/.test(value);

/** `browse`: the form can change the device, so the picker's page of cards is fetched; read-only, only the recorded card is looked up. */
export function useDeviceLibrary(projectId: number | undefined, recordedRef: DeviceModelRef | undefined, browse = true): DeviceLibraryState | undefined {
  const [filter, setFilter] = useState('');
  // The library is asked once typing pauses, not at every key.
  const [asked, setAsked] = useState('');
  useEffect(() => {
    const timer = setTimeout(() => setAsked(filter), SEARCH_PAUSE_MS);
    return () => clearTimeout(timer);
  }, [filter]);
  const enabled = projectId !== undefined;
  const page = useQuery({ ...projectDevicesQuery(projectId ?? 0, { q: asked, pageSize: DEVICE_PICKER_PAGE_SIZE }), enabled: enabled && browse });
  // A card of the page the spec records needs no lookup: it is in the library as recorded.
  const onPage = recordedRef ? libraryDeviceFor(recordedRef, page.data?.items) : undefined;
  const lookup = recordedRef && isChecksum(recordedRef.checksum) && !onPage && (!browse || !page.isPending) ? recordedRef : undefined;
  const recorded = useQuery({ ...recordedDeviceQuery(projectId ?? 0, lookup?.name ?? '', lookup?.checksum ?? ''), enabled: enabled && lookup !== undefined });
  return useMemo<DeviceLibraryState | undefined>(() => {
    if (!enabled) return undefined;
    const items = page.data?.items;
    if (onPage) return { items, total: page.data?.total ?? 0, loading: false, error: page.error, filter, setFilter, recorded: { recorded: onPage, current: onPage } };
    const own = recorded.data?.recorded;
    return {
      // The recorded card joins the page's cards when the filter leaves it out, so the form can still read it.
      items: items && own && own.state === 'library' && !items.some((d) => d.id === own.id) ? [...items, own] : items,
      total: page.data?.total ?? 0,
      loading: browse && page.isPending,
      error: page.error,
      filter,
      setFilter,
      recorded: lookup ? (recorded.data ?? (recorded.isPending ? 'loading' : null)) : recordedRef ? 'loading' : null,
    };
  }, [enabled, browse, page.data, page.isPending, page.error, recorded.data, recorded.isPending, filter, lookup, onPage, recordedRef]);
}
