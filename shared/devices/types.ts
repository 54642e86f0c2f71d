/** A card of a project's device library as the API returns it (`/api/projects/:id/devices`). */
import type { CardDevice } from './model-card';

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
  /** sha256 of the uploaded file, hex. */
  checksum: string;
  uploadedBy: { id: number; displayName: string };
  uploadedAt: string;
}
