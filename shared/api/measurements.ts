/** Bench measurements on the wire: /api/proposals/:id/measurements (the shapes live in shared/measurements/types.ts). */
import type { PageQuery } from './lists';

export type { MeasurementSummary, MeasurementView } from '../measurements/types';

/** GET /api/proposals/:id/measurements: paged like the proposal list. */
export type MeasurementListQuery = PageQuery;
