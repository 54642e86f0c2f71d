// @vitest-environment jsdom
/** The checks table marks a rejection check that passes by under 1 dB as a thin margin. */
import { cleanup, render, screen, within } from '@testing-library/react';
import { afterEach, expect, test } from 'vitest';
import type { Check } from '#shared/engine/types';
import { ChecksTable } from '../../../../web/src/features/proposals/components/ranking/checks-table';

afterEach(cleanup);

const check = (rule: string, margin: number, thinMargin?: boolean): Check => ({ rule, passed: true, severity: 'blocking', reason: 'Invented reason.', margin, marginUnit: 'dB', applicable: true, ...(thinMargin ? { thinMargin } : {}) });

test('when one rejection check passes by 0.6 dB and another by 8.2 dB, then only the first carries the thin-margin mark', () => {
  render(<ChecksTable checks={[check('cmrr-target', 0.6, true), check('cmrr-differential-worst-case', 8.2)]} />);

  const rows = within(screen.getByRole('table')).getAllByRole('row').slice(1);
  const thin = rows.filter((row) => row.textContent?.includes('thin margin'));
  expect(thin).toHaveLength(1);
  expect(thin[0].textContent).toContain('+0.6 dB');
});
