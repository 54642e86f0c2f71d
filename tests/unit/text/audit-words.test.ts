/** The one wording of an audit event: spec versions and imports, and the records an event quotes. */
import { describe, expect, test } from 'vitest';
import type { AuditEvent } from '#shared/api/admin';
import { describeEvent } from '#shared/text/audit-words';

const event = (action: string, details: Record<string, unknown>, entityType = 'spec'): AuditEvent => ({
  id: 1,
  at: '2026-03-02T10:00:00.000Z',
  actorId: 3,
  action,
  entityType,
  entityId: 9,
  projectId: 1,
  proposalId: entityType === 'spec' ? null : 4,
  beforeId: null,
  afterId: null,
  details,
});

describe('spec events', () => {
  test('when a spec is written, then its first version is named, and the file and row it came from when imported', () => {
    expect(describeEvent(event('spec.created', { title: 'Kestrel rev C', version: 1 })).what).toBe('wrote the spec (version 1)');
    expect(describeEvent(event('spec.created', { version: 1, import: { fileName: 'bench-specs.csv', row: 4 } })).what).toBe('wrote the spec (version 1) from bench-specs.csv, row 4');
  });

  test('when a version is written, then its number, how many fields changed (one or many) and its note quoted', () => {
    const words = describeEvent(event('spec.version-created', { version: 3, changes: 2, note: 'Rails to ±12 V.' }));
    expect(words.what).toBe('wrote version 3 of the spec: 2 fields changed');
    expect(words.quote).toEqual({ label: 'Note', text: 'Rails to ±12 V.' });
    expect(describeEvent(event('spec.version-created', { version: 2, changes: 1 })).what).toBe('wrote version 2 of the spec: 1 field changed');
    expect(describeEvent(event('spec.version-created', { version: 2, changes: 1, note: '   ' })).quote).toBeUndefined();
  });

  test('when a file of specs is imported, then the file and what became of its rows, leaving out the counts that are zero', () => {
    const what = describeEvent(event('specs.imported', { fileName: 'fernhollow-batch.csv', created: 3, 'new-version': 1, unchanged: 0, skipped: 0 }, 'project')).what;
    expect(what).toBe('imported specs from fernhollow-batch.csv (3 new, 1 new version)');
  });
});

describe('the records an event quotes', () => {
  const decided = event('proposal.decided', { kind: 'choose', topology: 'wilson', from: 'ranked', to: 'decided' }, 'decision');

  test('when the decision is given, then its reason is quoted; when nothing was recommended, choosing is not "another" option', () => {
    const words = describeEvent(decided, { decision: { kind: 'choose', topology: 'wilson', reason: 'More headroom at −40 °C.' } });
    expect(words).toMatchObject({ what: 'decided: chose another ranked option (Wilson mirror)', quote: { label: 'Reason', text: 'More headroom at −40 °C.' }, from: 'ranked', to: 'decided' });
    expect(describeEvent(decided, { nothingRecommended: true }).what).toBe('decided: chose a ranked option, none being recommended (Wilson mirror)');
  });

  test('when the review is given, then its comment is quoted; without it, none', () => {
    const returned = event('proposal.returned', { verdict: 'return', topology: 'wilson', from: 'decided', to: 'returned' }, 'review');
    expect(describeEvent(returned, { review: { comment: 'Check the rails.' } })).toMatchObject({ what: 'sent the decided design (Wilson mirror) back for rework', quote: { label: 'Comment', text: 'Check the rails.' } });
    expect(describeEvent(returned).quote).toBeUndefined();
  });
});
