import { EntitySchema } from 'typeorm';
import type { MeasuredPoint } from '#shared/measurements/measurement-csv';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';
import { jsonColumn } from './json-column';

/**
 * A bench measurement of a decided proposal's design: the uploaded CSV's bytes live in the
 * uploads directory under their sha256 (api/services/measurements.service.ts); this row keeps
 * what was read from it and who uploaded it. Never edited.
 */
export interface Measurement {
  id: number;
  proposalId: number;
  /** The decision in force at upload: the measured design is its topology, or its own values. */
  decisionId: number;
  topology: string;
  /** `option`: a ranked option was decided; `decision`: the designer's own values (an override). */
  designSource: 'option' | 'decision';
  /** `cmrr` | `gain`. */
  kind: string;
  /** `dB` | `V/V`. */
  unit: string;
  /** The client's file name, reduced to a printable base name (display only; the file is stored by its sha256). */
  fileName: string;
  sha256: string;
  sizeBytes: number;
  pointCount: number;
  /** The measured points (JSON text in the row): [{ frequencyHz, value }] in `unit`. */
  points: MeasuredPoint[];
  note: string | null;
  uploadedById: number;
  uploadedAt: string;
}

export const MeasurementEntity = new EntitySchema<Measurement>({
  name: 'Measurement',
  tableName: 'measurement',
  columns: {
    id: idColumn,
    proposalId: foreignKeyColumn('proposal_id'),
    decisionId: foreignKeyColumn('decision_id'),
    topology: shortTextColumn(40),
    designSource: { ...shortTextColumn(20), name: 'design_source' },
    kind: shortTextColumn(20),
    unit: shortTextColumn(10),
    fileName: { ...shortTextColumn(255), name: 'file_name' },
    sha256: shortTextColumn(64),
    sizeBytes: { type: 'integer', name: 'size_bytes' },
    pointCount: { type: 'integer', name: 'point_count' },
    points: jsonColumn(),
    note: textColumn(true),
    uploadedById: foreignKeyColumn('uploaded_by_id'),
    uploadedAt: timestampColumn('uploaded_at'),
  },
});
