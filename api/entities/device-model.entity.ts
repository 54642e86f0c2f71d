import { EntitySchema } from 'typeorm';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';
import { jsonColumn } from './json-column';

/**
 * One NPN `.model` card of a project's device library, as uploaded (shared/devices/model-card.ts
 * reads it). A card's text is never edited: removing it or replacing it with a new text retires
 * the row (it stays readable for the specs that recorded it) and frees its name.
 */
export interface DeviceModel {
  id: number;
  projectId: number;
  /** The model name as written in the card. */
  name: string;
  /** The name lower-cased (SPICE names are case-insensitive): unique per project. */
  nameKey: string;
  /** Every parameter of the card (JSON text in the row): upper-case name → number (SI units). */
  parameters: Record<string, number>;
  /** The card's own lines as written in the file. */
  cardText: string;
  /** Line of the `.model` keyword in the uploaded file. */
  sourceLine: number;
  /** The uploaded file's name (base name only) and the sha256 of its bytes, hex. */
  fileName: string;
  checksum: string;
  uploadedById: number;
  uploadedAt: string;
  /** Set when the card left the library: when, by whom, and how (`removed` | `replaced`). */
  retiredAt: string | null;
  retiredById: number | null;
  retirement: 'removed' | 'replaced' | null;
  /** For a replaced card: the card that took its place. */
  replacedById: number | null;
}

export const DeviceModelEntity = new EntitySchema<DeviceModel>({
  name: 'DeviceModel',
  tableName: 'device_model',
  columns: {
    id: idColumn,
    projectId: foreignKeyColumn('project_id'),
    name: shortTextColumn(64),
    nameKey: { ...shortTextColumn(64), name: 'name_key' },
    parameters: jsonColumn(),
    cardText: { ...textColumn(), name: 'card_text' },
    sourceLine: { type: 'integer', name: 'source_line' },
    fileName: { ...shortTextColumn(255), name: 'file_name' },
    checksum: shortTextColumn(64),
    uploadedById: foreignKeyColumn('uploaded_by_id'),
    uploadedAt: timestampColumn('uploaded_at'),
    retiredAt: { type: 'varchar', length: 32, name: 'retired_at', nullable: true },
    retiredById: foreignKeyColumn('retired_by_id', true),
    retirement: { ...shortTextColumn(20, true), name: 'retirement' },
    replacedById: foreignKeyColumn('replaced_by_id', true),
  },
});
