/** A project's activity as CSV: RFC 4180 quoting, one line per event, user text that cannot run as a spreadsheet formula. */
import Papa from 'papaparse';
import { describe, expect, test } from 'vitest';
import type { ActivityEvent } from '#shared/api/activity';
import { ACTIVITY_CSV_HEADER, activityCsvHeader, activityCsvRows } from '#shared/export/activity-csv';

const decided: ActivityEvent = {
  id: 41,
  at: '2026-03-02T10:00:00.000Z',
  actorId: 7,
  action: 'proposal.decided',
  entityType: 'decision',
  entityId: 12,
  projectId: 1,
  proposalId: 30,
  beforeId: null,
  afterId: 12,
  details: { kind: 'override', topology: 'cascode', passes: true },
  actor: { id: 7, displayName: '=Wren, "lead"' },
  spec: { id: 5, title: '-12 V rail, "quiet" channel' },
  records: { decision: { kind: 'override', topology: 'cascode', reason: '@once\nthen twice' } },
};

describe('activityCsvRows', () => {
  test('when an event holds commas, quotes, line breaks and formula starts, then a reader gets every cell back on one line, the formula starts neutralised', () => {
    const text = activityCsvHeader() + activityCsvRows([decided]);
    expect(text.endsWith('\r\n')).toBe(true);
    expect(text.split('\r\n')).toHaveLength(3);
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual([...ACTIVITY_CSV_HEADER]);
    expect(parsed.data).toEqual([
      {
        event_id: '41',
        at_utc: '2026-03-02T10:00:00.000Z',
        person_id: '7',
        person: `'=Wren, "lead"`,
        kind: 'Decisions',
        action: 'proposal.decided',
        spec_id: '5',
        spec_title: `'-12 V rail, "quiet" channel`,
        proposal_id: '30',
        what: 'decided: own values (Cascode mirror)',
        quoted: 'Reason: @once then twice',
        details_json: '{"kind":"override","topology":"cascode","passes":true}',
      },
    ]);
  });

  test('when an event has no actor, spec or kind, then those cells are plain words or empty', () => {
    const row = activityCsvRows([{ ...decided, action: 'project.note', actorId: null, actor: null, spec: null, proposalId: null, records: {} }]);
    const [cells] = Papa.parse<string[]>(row).data;
    expect(cells.slice(2, 9)).toEqual(['', 'the system', '', 'project.note', '', '', '']);
  });
});
