/** A project's device library on the wire: /api/projects/:id/devices (the card shapes live in shared/devices/types.ts). */
import type { PageQuery } from './lists';

export type { DeviceModelView, RecordedDeviceModel } from '../devices/types';

/** GET /api/projects/:id/devices: a page of the library (or of its former cards), optionally names containing `q`. */
export interface DeviceListQuery extends PageQuery {
  /** Names containing this (case-insensitive); absent or empty: every card. */
  q?: string;
  /** `library`: the cards specs can be filled from; `former`: removed and replaced ones. */
  state: 'library' | 'former';
}

/** GET /api/projects/:id/devices/recorded: the card a spec's `deviceModel` names. */
export interface RecordedDeviceQuery {
  name: string;
  checksum: string;
}
