/**
 * The one current design of a proposal (shared/workflow/current-design.ts) and the binding of
 * verification results to what they simulated (shared/verification/binding.ts). The stale words
 * are written here as a designer reads them; sha256 values are checked against the FIPS 180-2
 * example ("abc").
 */
import { createHash } from 'node:crypto';
import { describe, expect, test } from 'vitest';
import { fingerprint, designBinding } from '../../../api/verification/design-binding';
import type { RecommendResult } from '#shared/engine/recommend';
import type { Design } from '#shared/engine/types';
import { bindingChanges, canonicalJson, freshness, resultForDesign } from '#shared/verification/binding';
import { currentDesign, currentDesignSummary } from '#shared/workflow/current-design';

const design = (rc: number, re = 82.5): Design => ({
  device: { family: 'npn', beta: 180, earlyVoltageV: 72, saturationCurrentA: 9e-15 },
  supply: { positiveV: 9, negativeV: -9 },
  collectorResistanceOhm: rc,
  pairEmitterResistanceOhm: re,
  tail: { topology: 'degenerated-mirror', referenceResistanceOhm: 24_300, emitterResistanceOhm: 1500 },
});

const option = (topology: string, d: Design | null) => ({ topology, design: d, checks: [], passes: true }) as unknown as RecommendResult['options'][number];
const result = { recommended: 'degenerated-mirror', options: [option('degenerated-mirror', design(2260)), option('cascode', { ...design(2260), tail: { topology: 'cascode', referenceResistanceOhm: 24_300 } })] } as unknown as RecommendResult;

describe('the current design', () => {
  test('when nobody has decided, then it is the recommendation; with no recommendation, there is none', () => {
    expect(currentDesign(result, [])).toMatchObject({ basis: 'recommendation', topology: 'degenerated-mirror', ownValues: false, differsFromRecommendation: false });
    expect(currentDesign({ ...result, recommended: null }, [])).toBeNull();
  });

  test('when a decision was sent back and decided again, then the latest decision is the design, with the reason for differing', () => {
    const first = { id: 1, kind: 'accept' as const, topology: 'degenerated-mirror', design: design(2260), evaluation: null, reason: null };
    const second = { id: 2, kind: 'choose' as const, topology: 'cascode', design: design(2260), evaluation: null, reason: 'Long cable run.' };
    expect(currentDesign(result, [first])).toMatchObject({ basis: 'decision', decisionId: 1, topology: 'degenerated-mirror', differsFromRecommendation: false, reason: null });
    expect(currentDesign(result, [first, second])).toMatchObject({ basis: 'decision', decisionId: 2, topology: 'cascode', differsFromRecommendation: true, reason: 'Long cable run.' });
  });

  test('when own values are decided on the recommended topology, then they still differ from the recommendation, and their values are the design', () => {
    const own = design(2490, 100);
    const current = currentDesign(result, [{ id: 3, kind: 'override', topology: 'degenerated-mirror', design: own, evaluation: option('degenerated-mirror', own), reason: 'New reel.' }]);
    expect(current).toMatchObject({ ownValues: true, differsFromRecommendation: true, reason: 'New reel.' });
    expect(current!.design!.collectorResistanceOhm).toBe(2490);
    expect(currentDesignSummary('degenerated-mirror', { id: 3, kind: 'override', topology: 'degenerated-mirror', reason: 'New reel.' })).toMatchObject({ ownValues: true, differsFromRecommendation: true });
  });
});

describe('binding a result to what it simulated', () => {
  const inputs = (d: Design, specVersion = 1) => ({ topology: 'degenerated-mirror', design: d, specVersionId: specVersion + 10, specVersion, engineVersion: '1.0.0', rulesetVersion: 'a'.repeat(64) });

  test('when the canonical text is hashed, then it is sha256 (FIPS 180-2: "abc")', () => {
    expect(createHash('sha256').update('abc').digest('hex')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(canonicalJson({ b: 1, a: [true, null], c: undefined })).toBe('{"a":[true,null],"b":1}');
  });

  test('when the same design is written with its keys in another order or its defaults left out, then the fingerprint is the same', () => {
    const reordered = JSON.parse(JSON.stringify({ tail: design(2260).tail, collectorResistanceOhm: 2260, supply: design(2260).supply, device: design(2260).device, pairEmitterResistanceOhm: 82.5 })) as Design;
    const withDefaults: Design = { ...design(2260), collectorMismatch: 0, inputCommonModeV: 0, temperatureC: 27, tailCapacitanceF: 0, pairSaturationCurrentMismatch: 0 };
    expect(designBinding(inputs(reordered)).fingerprint).toBe(designBinding(inputs(design(2260))).fingerprint);
    expect(designBinding(inputs(withDefaults)).fingerprint).toBe(designBinding(inputs(design(2260))).fingerprint);
    expect(designBinding(inputs(design(2261))).fingerprint).not.toBe(designBinding(inputs(design(2260))).fingerprint);
    expect(fingerprint(designBinding(inputs(design(2260))).inputs)).toMatch(/^[0-9a-f]{64}$/);
  });

  test('when the fields of the full model are at their defaults (no frequencies, no source resistance, no card), then the fingerprint is the one from before they existed', () => {
    // the SHA-256 of the canonical inputs of design(2260) as stored before these fields existed: computed here from that older shape
    const before = createHash('sha256').update(canonicalJson(designBinding(inputs(design(2260))).inputs)).digest('hex');
    const withNewDefaults: Design = { ...design(2260), loadCapacitanceF: 0, sourceResistanceOhm: 0, pairBetaMismatch: 0, pairEarlyVoltageMismatch: 0, frequenciesHz: [], device: { ...design(2260).device, model: {} } };
    expect(designBinding(inputs(withNewDefaults)).fingerprint).toBe(before);
    expect(bindingChanges(inputs(design(2260)), inputs(withNewDefaults))).toEqual([]);
    expect(bindingChanges(inputs({ ...design(2260), frequenciesHz: [1000] }), inputs({ ...design(2260), frequenciesHz: [1000, 1e6] }))).toEqual(['simulated frequenciesHz 1000, decided 1000, 1000000']);
  });

  test('when RC and the pair RE changed, then the changes read as a designer would say them', () => {
    expect(bindingChanges(inputs(design(10_000, 78.7)), inputs(design(12_000, 100)))).toEqual(['simulated RC 10 kΩ, decided 12 kΩ', 'simulated pair RE 78.7 Ω, decided 100 Ω']);
  });

  test('when the spec moved on, then the change names the versions', () => {
    expect(bindingChanges(inputs(design(2260), 3), inputs(design(2260), 4))).toEqual(['spec version 3, now 4']);
  });

  test('when a result has no binding, then it is unbound; equal fingerprints are current; others stale with what changed', () => {
    const now = designBinding(inputs(design(12_000)));
    expect(freshness(undefined, now)).toEqual({ state: 'unbound' });
    expect(freshness(designBinding(inputs(design(12_000))), now)).toEqual({ state: 'current' });
    expect(freshness(designBinding(inputs(design(10_000))), now)).toEqual({ state: 'stale', changes: ['simulated RC 10 kΩ, decided 12 kΩ'] });
  });

  test('when a job holds ranked options and own values, then the result about own values is the decision entry, about a ranked design its option', () => {
    const own = designBinding(inputs(design(12_000)));
    const results = [
      { topology: 'degenerated-mirror', source: 'option' as const, binding: designBinding(inputs(design(2260))) },
      { topology: 'degenerated-mirror', source: 'decision' as const, binding: designBinding(inputs(design(10_000))) },
    ];
    expect(resultForDesign(results, { topology: 'degenerated-mirror', ownValues: true, binding: own })).toBe(results[1]);
    expect(resultForDesign(results, { topology: 'degenerated-mirror', ownValues: false, binding: results[0].binding })).toBe(results[0]);
    expect(resultForDesign(results, { topology: 'cascode', ownValues: false, binding: null })).toBeNull();
  });
});
