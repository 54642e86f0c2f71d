/** A stored bench measurement as the API returns it (`/api/proposals/:id/measurements`). */
import type { MeasurementComparison } from './comparison';
import type { MeasuredPoint, MeasurementKind, MeasurementUnit } from './measurement-csv';

export interface MeasurementView {
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
  points: MeasuredPoint[];
  note: string | null;
  uploadedBy: { id: number; displayName: string };
  uploadedAt: string;
  /** Measured against the decided design's prediction (and SPICE simulation, when one finished). */
  comparison: MeasurementComparison;
}

/** Longest note kept with a measurement, characters. */
export const MEASUREMENT_NOTE_MAX_LENGTH = 1000;
