import { useQuery } from '@tanstack/react-query';
import type { Design } from '#shared/engine/types';
import { whatIfQuery } from '../../api/decision-mutations';
import { useDebouncedValue } from './use-debounced-value';

/** Pause after the last keystroke before asking the server (long enough for "4k7" to be typed). */
export const WHAT_IF_DEBOUNCE_MS = 300;

/**
 * The server's analysis of the edited design, asked once typing pauses. Each design is its own
 * query key, so an answer that arrives late for an older design is never shown for the new one.
 */
export function useWhatIf(design: Design | null) {
  const designJson = design ? JSON.stringify(design) : null;
  const settledJson = useDebouncedValue(designJson, WHAT_IF_DEBOUNCE_MS);
  const query = useQuery({ ...whatIfQuery(settledJson ?? ''), enabled: settledJson !== null });
  return { query, settling: designJson !== settledJson, hasDesign: designJson !== null };
}

export type WhatIf = ReturnType<typeof useWhatIf>;
