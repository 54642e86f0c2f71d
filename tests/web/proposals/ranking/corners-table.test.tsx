// @vitest-environment jsdom
/**
 * The corners table scrolls sideways on a narrow screen, so its scroll box must be reachable
 * from the keyboard and named (axe's scrollable-region-focusable rule, WCAG 2.1.1).
 */
import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, expect, test } from 'vitest';
import { CornersTable } from '../../../../web/src/features/proposals/components/ranking/corners-table';
import { studioLine } from './fixtures';

afterEach(cleanup);

test('the scroll box around the corners table is focusable and says it scrolls sideways', () => {
  render(<CornersTable option={studioLine().options[0]} />);
  const box = screen.getByRole('group', { name: /Figures at each corner of the spec \(scrolls sideways/ });
  expect(box.getAttribute('tabindex')).toBe('0');
  expect(box.querySelector('table')).not.toBeNull();
});
