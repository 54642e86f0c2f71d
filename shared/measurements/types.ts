/** A stored bench measurement as the API returns it (`/api/proposals/:id/measurements`). */
import type { MeasurementComparison } from './comparison';
import type { MeasuredPoint, MeasurementKind, MeasurementUnit } from './measurement-csv';

/** One measurement in the list: its metadata and its comparison, without the points. */
export interface MeasurementSummary {
  id: number;
  proposalId: number;
  /** The decision in force at upload, and the design it settled on. */
  decisionId: number;
  topology: string;
  designSource: 'option' | 'decision';
  kind: MeasurementKind;
  unit: MeasurementUnit;
  /** The uploaded file's name, printable base name (display only). */
  fileName: string;
  /** sha256 of the file's bytes, hex: the stored file's name. */
  sha256: string;
  sizeBytes: number;
  pointCount: number;
  note: string | null;
  uploadedBy: { id: number; displayName: string };
  uploadedAt: string;
  /** Measured against the decided design's prediction (and SPICE simulation, when one finished). */
  comparison: MeasurementComparison;
}

/** One measurement with its points (`GET …/measurements/:measurementId`, the upload's answer, export.json). */
export interface MeasurementView extends MeasurementSummary {
  points: MeasuredPoint[];
}

/** Longest note kept with a measurement, characters. */
export const MEASUREMENT_NOTE_MAX_LENGTH = 1000;

/**
 * How much bench data one proposal and one project keep (each file is also held to
 * MEASUREMENT_FILE_MAX_BYTES and MEASUREMENT_MAX_POINTS). Bytes are the uploaded files' sizes as
 * sent (a file uploaded twice counts twice). When full, an upload answers 409; when the file
 * would pass a total, 413 (a smaller file may still fit).
 */
export const MEASUREMENT_QUOTA = {
  proposal: { count: 20, points: 50_000, bytes: 2 * 1024 * 1024 },
  project: { count: 200, points: 500_000, bytes: 20 * 1024 * 1024 },
} as const;
