import { describe, expect, test } from 'vitest';
import { topologyNameInText } from '../../../web/src/lib/topology-names';

describe('topologyNameInText', () => {
  test.each([
    ['cascode', 'cascode mirror'],
    ['simple-mirror', 'simple mirror'],
    // An acronym keeps its capitals inside a sentence (PTAT: proportional to absolute temperature)
    ['ptat', 'PTAT (constant-gm) source'],
    [null, '—'],
  ])('%s reads as %j inside a sentence', (id, words) => expect(topologyNameInText(id)).toBe(words));
});
