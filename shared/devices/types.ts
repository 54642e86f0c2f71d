/** A card of a project's device library as the API returns it (`/api/projects/:id/devices`). */
import type { CardDevice } from './model-card';

/** `library`: in the library, offered to specs; `replaced`: a newer text of the name took its place; `removed`: taken out. */
export type DeviceModelState = 'library' | 'replaced' | 'removed';

export interface DeviceModelView {
  id: number;
  projectId: number;
  name: string;
  /** The spec's device fields the card fills (IS, BF, VAF). */
  device: CardDevice;
  /** Every parameter of the card, upper-case name → number (SI units). */
  parameters: Record<string, number>;
  /** How the engine uses the card (parameters it leaves out, BR, TNOM). */
  notes: string[];
  /** The card's lines as written in the file. */
  card: string;
  /** Line of the card in its file. */
  line: number;
  fileName: string;
  /** sha256 of the uploaded file, hex (what a spec records as `deviceModel.checksum`). */
  checksum: string;
  uploadedBy: { id: number; displayName: string };
  uploadedAt: string;
  state: DeviceModelState;
  /** When and by whom a replaced or removed card left the library; null while it is in it. */
  retiredAt: string | null;
  retiredBy: { id: number; displayName: string } | null;
  /** For a replaced card: the card that took its place. */
  replacedById: number | null;
}

/** What a spec's `deviceModel { name, checksum }` resolves to (`GET …/devices/recorded`). */
export interface RecordedDeviceModel {
  /** The exact card the spec was filled from (whatever its state now); null when the project never held it. */
  recorded: DeviceModelView | null;
  /** The library's card of that name today (the same card, a replacement, or null when none). */
  current: DeviceModelView | null;
}

/**
 * How many cards a project keeps: `cards` in the library at once, `versions` stored in all
 * (library, replaced and removed: retired texts stay readable for the specs that recorded them).
 * Each upload is also held to MODEL_FILE_MAX_CARDS and MODEL_FILE_MAX_BYTES.
 */
export const DEVICE_LIBRARY_QUOTA = { cards: 500, versions: 2000 } as const;
