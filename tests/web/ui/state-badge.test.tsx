// @vitest-environment jsdom
/**
 * Proposal state badges: every state has its word and a mark of its own (no two states share a
 * mark or a tone), the word is what assistive technology reads, and none of the marks is a circle
 * filled by a fraction (the quarter/half/full pie glyphs ◔ ◑ ● of other software).
 */
import { cleanup, render } from '@testing-library/react';
import { afterEach, describe, expect, test } from 'vitest';
import { CLOSED_STATES, PROPOSAL_STATES } from '#shared/workflow/proposal-states';
import { STATE_LABELS, StateBadge } from '../../../web/src/components/ui/state-badge';

afterEach(cleanup);

const PIE_GLYPHS = ['◔', '◑', '◕', '●', '○', '◐', '◒', '◓'];

describe('StateBadge', () => {
  test.each(PROPOSAL_STATES)('%s: the word is read, the drawn mark is hidden', (state) => {
    const { container } = render(<StateBadge state={state} />);
    const badge = container.firstElementChild!;
    expect(badge.textContent).toBe(STATE_LABELS[state].label);
    const mark = badge.querySelector('svg')!;
    expect(mark.getAttribute('aria-hidden')).toBe('true');
    expect(mark.querySelectorAll('path').length).toBeGreaterThan(0);
  });

  test('each state has its own word and mark, each open state its own tone (closed ones share the quiet tone), and no mark is a part-filled circle', () => {
    const looks = PROPOSAL_STATES.map((s) => STATE_LABELS[s]);
    const open = PROPOSAL_STATES.filter((s) => !CLOSED_STATES.includes(s) || s === 'approved').map((s) => STATE_LABELS[s]);
    expect(new Set(looks.map((l) => l.label)).size).toBe(looks.length);
    expect(new Set(looks.map((l) => l.glyph)).size).toBe(looks.length);
    expect(new Set(open.map((l) => l.tone)).size).toBe(open.length);
    for (const state of CLOSED_STATES.filter((s) => s !== 'approved')) expect(STATE_LABELS[state].tone).toBe('quiet');
    for (const look of looks) expect(PIE_GLYPHS).not.toContain(look.glyph);
    const { container } = render(
      <>
        {PROPOSAL_STATES.map((s) => (
          <StateBadge key={s} state={s} />
        ))}
      </>,
    );
    expect(container.textContent).not.toMatch(new RegExp(`[${PIE_GLYPHS.join('')}]`));
    expect(container.querySelectorAll('.rounded-full')).toHaveLength(0);
  });
});
