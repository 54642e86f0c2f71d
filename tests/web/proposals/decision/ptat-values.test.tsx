// @vitest-environment jsdom
/**
 * The PTAT tail's values where a person reads and edits them: its emitter-area ratios are plain
 * ratios ("8×"), never ohms and never held to the resistor series; own values take them as typed
 * ("12", "12×") within the design schema's bounds (N more than 1, at most 100). The ranking is the
 * real engine's for an invented spec (tests/web/fixtures/specs/geophone-node.json).
 */
import { cleanup, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import type { Design } from '#shared/engine/types';
import { formatQuantity } from '#shared/units/format-quantity';
import { validateSpec } from '#shared/validate';
import { DecisionPanel } from '../../../../web/src/features/proposals/components/decision-panel';
import { DesignValues } from '../../../../web/src/features/proposals/components/decision/design-values';
import { SizedValues } from '../../../../web/src/features/proposals/components/ranking/sized-values';
import specDocument from '../../fixtures/specs/geophone-node.json';
import { geophoneNode } from '../ranking/fixtures';
import { mockFetch, type Call } from './fixtures/fetch-mock';
import { DESIGNER, proposalFixture } from './fixtures/proposal-fixture';
import { renderWithClient } from '../../helpers/render';

const RANKING = geophoneNode();
const PTAT = RANKING.options.find((o) => o.topology === 'ptat')!;
const DESIGN = PTAT.design!;
const TAIL = DESIGN.tail as { topology: 'ptat'; emitterResistanceOhm: number; startupResistanceOhm: number; areaRatio: number };
const checked = validateSpec(specDocument);
if (!checked.ok) throw new Error('the geophone fixture spec no longer validates');

let fetchMock: ReturnType<typeof mockFetch> | undefined;
afterEach(() => {
  cleanup();
  if (fetchMock) expect(fetchMock.unmocked).toEqual([]);
  fetchMock = undefined;
  vi.unstubAllGlobals();
});

const proposal = () =>
  proposalFixture({ result: RANKING, recommendedTopology: RANKING.recommended, specVersion: { id: 1, version: 1, title: checked.value.title, note: null, payload: checked.value } });

/** The rows of a table group, as "name | value | note" text. */
const rowTexts = (table: HTMLElement) => within(table).getAllByRole('row').map((row) => [...row.children].map((cell) => cell.textContent).join(' | '));

describe('the sized values of a PTAT option', () => {
  test('the area ratios are a group of their own, as ratios; the resistors stay in ohms; the PNP has its own group', () => {
    render(<SizedValues design={DESIGN} series="E96" tolerancePercent={0.5} facts={null} predicted={null} />);
    const rows = rowTexts(screen.getByRole('table'));
    expect(rows).toContain(`Area ratio N | ${TAIL.areaRatio}× | Q4's emitter area over Q3's (N)`);
    // The output ratio the design leaves out is the contract's default, 1
    expect(rows).toContain("Output area ratio | 1× | Q9's emitter area over Q3's");
    expect(rows.some((r) => r.startsWith(`RE4 | ${formatQuantity(TAIL.emitterResistanceOhm, 'Ohm')} |`))).toBe(true);
    expect(rows.some((r) => r.startsWith(`RSU | ${formatQuantity(TAIL.startupResistanceOhm, 'Ohm')} |`))).toBe(true);
    expect(rows.filter((r) => /^Area ratio|^Output area/.test(r)).join()).not.toMatch(/Ω|E96/);
    expect(rows).toContain('PNP transistors (Q7, Q8)');
    expect(rows).toContain('β (BF) | 110 | ');
    expect(rows).toContain('VAF | 46 V | Early voltage');
    expect(rows).toContain('IS | 6.3 fA | at 27 °C');
  });

  test('a mirror without ratios has no ratio group and no PNP group', () => {
    const widlar = RANKING.options.find((o) => o.topology === 'widlar')!.design!;
    render(<SizedValues design={widlar} series="E96" tolerancePercent={0.5} facts={null} predicted={null} />);
    const rows = rowTexts(screen.getByRole('table'));
    expect(rows).not.toContain('Emitter-area ratios');
    expect(rows.some((r) => r.startsWith('PNP'))).toBe(false);
    expect(rows).toContain('Transistors (NPN, all alike)');
  });
});

describe('a decided PTAT design’s values', () => {
  test('each ratio reads as a ratio beside the ranked one when it differs', () => {
    const own: Design = { ...DESIGN, tail: { ...TAIL, areaRatio: 12, outputAreaRatio: 2 } };
    render(<DesignValues design={own} compareWith={DESIGN} />);
    const term = (name: string) => screen.getByText(name, { selector: 'dt' }).nextElementSibling!.textContent;
    // The ranked value sits in a margin-spaced note beside it
    expect(term('Area ratio N')).toBe(`12×(ranked ${TAIL.areaRatio}×)`);
    expect(term('Output area ratio')).toBe('2×(ranked 1×)');
    expect(term('Start-up resistor')).toBe(formatQuantity(TAIL.startupResistanceOhm, 'Ohm', 4));
  });
});

describe('own values of a PTAT option', () => {
  /** The analysis of a design: the ranked option's own figures. */
  const analyzeAnswer = () => ({ body: { ...PTAT.predicted!, notice: RANKING.notice } });

  test('the ratio fields start at the ranked ratios as plain numbers and read as ratios, with no series note', async () => {
    fetchMock = mockFetch({ 'GET /api/projects/1/members': () => ({ body: { items: [DESIGNER] } }), 'POST /api/analyze': analyzeAnswer });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposal()} user={DESIGNER} />);
    await user.click(screen.getByRole('radio', { name: 'Use my own values' }));

    const area = screen.getByRole('textbox', { name: 'Area ratio N' }) as HTMLInputElement;
    const output = screen.getByRole('textbox', { name: 'Output area ratio' }) as HTMLInputElement;
    expect(area.value).toBe(String(TAIL.areaRatio));
    expect(output.value).toBe('1');
    const reading = (input: HTMLElement) => document.getElementById(input.getAttribute('aria-describedby')!)!.textContent;
    expect(reading(area)).toBe(`= ${TAIL.areaRatio}×`);
    expect(reading(output)).toBe('= 1×');
    expect(screen.getByRole('textbox', { name: 'Start-up resistor' })).toBeTruthy();
  });

  test('a ratio typed with its sign is read, and the analysis is asked with it and the output ratio written out', async () => {
    fetchMock = mockFetch({ 'GET /api/projects/1/members': () => ({ body: { items: [DESIGNER] } }), 'POST /api/analyze': analyzeAnswer });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposal()} user={DESIGNER} />);
    await user.click(screen.getByRole('radio', { name: 'Use my own values' }));

    const area = screen.getByRole('textbox', { name: 'Area ratio N' });
    await user.clear(area);
    await user.type(area, '12×');
    expect(document.getElementById(area.getAttribute('aria-describedby')!)!.textContent).toBe(`= 12× · ranked ${TAIL.areaRatio}×`);
    await waitFor(() => expect((fetchMock!.to('POST', '/api/analyze').at(-1) as Call).body).toMatchObject({ tail: { ...TAIL, areaRatio: 12, outputAreaRatio: 1 } }));
  });

  test.each([
    ['1', 'Must be more than 1×'], // N = 1 leaves no ΔVBE; the schema's exclusive minimum
    ['150', 'Must be at most 100×'],
    ['8 Ω', 'unexpected unit "Ω"'],
  ])('a ratio of %j is refused in place (%s) and no analysis is asked for it', async (text, message) => {
    fetchMock = mockFetch({ 'GET /api/projects/1/members': () => ({ body: { items: [DESIGNER] } }), 'POST /api/analyze': analyzeAnswer });
    const user = userEvent.setup();
    renderWithClient(<DecisionPanel proposal={proposal()} user={DESIGNER} />);
    await user.click(screen.getByRole('radio', { name: 'Use my own values' }));

    const area = screen.getByRole('textbox', { name: 'Area ratio N' });
    await user.clear(area);
    await user.type(area, text);
    expect(area.getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByText(new RegExp(message))).toBeTruthy();
    await new Promise((resolve) => setTimeout(resolve, 500));
    const asked = fetchMock.to('POST', '/api/analyze').map((c) => (c.body as { tail: { areaRatio: number } }).tail.areaRatio);
    expect(asked.every((n) => n === TAIL.areaRatio)).toBe(true);
  });
});
