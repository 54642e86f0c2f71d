/** How a decision's kind reads: choosing an option is "another" only beside a recommendation. */
import { describe, expect, test } from 'vitest';
import { describeEvent } from '../../../../web/src/features/proposals/components/audit/describe-event';
import { decisionKindWords } from '../../../../web/src/features/proposals/components/decision/decided-option';

const proposal = (recommended: string | null) => ({ result: { recommended }, decisions: [{ id: 5, kind: 'choose', topology: 'degenerated-mirror', reason: 'Span calibration takes the drift out.' }] }) as never;
const decided = { id: 1, action: 'proposal.decided', entityId: 5, actorId: 3, createdAt: '2026-03-02T10:00:00.000Z', details: { kind: 'choose', topology: 'degenerated-mirror', from: 'ranked', to: 'decided' } } as never;

describe('the words of a chosen option', () => {
  test('when the engine recommended an option and the designer chose another, then it reads "chose another ranked option"', () => {
    expect(decisionKindWords('choose', proposal('cascode'))).toBe('chose another ranked option');
    expect(describeEvent(decided, proposal('cascode')).what).toBe('decided: chose another ranked option (Degenerated mirror)');
  });

  test('when nothing was recommended (no option passes), then choosing one is not "another": the words say none was recommended', () => {
    expect(decisionKindWords('choose', proposal(null))).toBe('chose a ranked option (none was recommended)');
    const what = describeEvent(decided, proposal(null)).what;
    expect(what).not.toMatch(/another/);
    expect(what).toBe('decided: chose a ranked option, none being recommended (Degenerated mirror)');
  });

  test('when the recommendation was accepted, then the words say so whatever the proposal', () => {
    expect(decisionKindWords('accept', proposal('cascode'))).toBe('accepted the recommendation');
  });
});
