import { describe, expect, test } from 'vitest';
import { composeDigest } from '../../../api/mail/compose';
import { formatDateTime } from '#shared/text/dates';

const entry = (n: number) => ({ subject: `Proposal #${n} waits for a decision (spec version 1)`, summary: 'Someone asked for a proposal.', link: `https://longtail.example/proposals/${n}` });

describe('the words of e-mails', () => {
  test('when a digest holds one update, then its subject and opening speak of one update, in the singular', () => {
    const digest = composeDigest([entry(7)], 'Ada Quill', 'https://longtail.example/profile');

    expect(digest.subject).toBe('Longtail: 1 workflow update');
    expect(digest.text).not.toMatch(/\b1 workflow updates\b/);
    expect(digest.text).toContain('One more workflow update came for you');
  });

  test('when a digest holds several updates, then the subject counts them in the plural', () => {
    expect(composeDigest([entry(7), entry(8)], 'Ada Quill', 'https://longtail.example/profile').subject).toBe('Longtail: 2 workflow updates');
  });

  test('when a moment is written for an e-mail, then it reads as the app’s one date format in UTC, the zone named, never as an ISO stamp', () => {
    // 2026-12-05T20:32:21.023Z is Saturday 5 December 2026, 20:32 in UTC.
    expect(formatDateTime('2026-12-05T20:32:21.023Z', { timeZone: 'UTC' })).toBe('5 Dec 2026, 20:32 UTC');
  });
});
