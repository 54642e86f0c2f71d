// @vitest-environment jsdom
/**
 * The verification's list of figures outside tolerance with their likely cause, and the card
 * simulated (difference-causes.tsx). The figures are written out by hand: a tail node 117 mV
 * off (a card characterised at TNOM = 0 °C, see tests/api/verification-card.test.ts for the
 * derivation) against the 50 mV node-voltage tolerance, and a saturated corner.
 */
import { render, screen, within } from '@testing-library/react';
import { describe, expect, test } from 'vitest';
import type { OptionVerification, VerifiedFigure } from '#shared/verification/types';
import { DifferenceCauses } from '../../../../web/src/features/proposals/components/verification/difference-causes';

const figure = (over: Partial<VerifiedFigure>): VerifiedFigure => ({
  key: 'tailCurrentA',
  label: 'Tail current',
  unit: 'A',
  predicted: 1e-3,
  simulated: 1e-3,
  delta: 0,
  deltaKind: 'percent',
  tolerance: 3,
  agrees: true,
  ...over,
});

function option(over: Partial<OptionVerification>): OptionVerification {
  return {
    topology: 'widlar',
    source: 'option',
    outcome: 'verified',
    error: null,
    nominal: {
      label: 'ICM 0 V, 27 °C',
      inputCommonModeV: 0,
      temperatureC: 27,
      figures: [
        figure({}),
        figure({
          key: 'tailNodeVoltageV',
          label: 'Tail node voltage',
          unit: 'V',
          predicted: -0.69,
          simulated: -0.573,
          delta: -0.117,
          deltaKind: 'volts',
          tolerance: 0.05,
          agrees: false,
          cause: { kind: 'spice-only-parameters', parameters: ['TNOM'], saturated: [] },
        }),
      ],
    },
    corners: [
      {
        label: 'ICM 2 V, 85 °C',
        inputCommonModeV: 2,
        temperatureC: 85,
        figures: [figure({ key: 'gain', label: 'Differential gain |Ad|', unit: '', delta: -7.5, agrees: false, tolerance: 5, cause: { kind: 'saturation', parameters: [], saturated: [{ name: 'Q4', vbcV: 0.21 }] } })],
      },
    ],
    rejectionCurve: [],
    agrees: false,
    disagreements: 2,
    elapsedMs: 100,
    card: { name: 'FH4N10', spiceOnlyParameters: ['TNOM'] },
    ...over,
  };
}

describe('DifferenceCauses', () => {
  test('when figures fall outside tolerance, then each is listed with its condition, difference, tolerance and likely cause', () => {
    render(<DifferenceCauses option={option({})} />);
    const items = screen.getAllByRole('listitem');
    expect(items).toHaveLength(2);
    expect(items[0].textContent).toMatch(/^Tail node voltage, ICM 0 V, 27 °C: engine minus ngspice −117 mV \(tolerance ±50 mV\)\./);
    expect(within(items[0]).getByText(/Likely the card's TNOM: SPICE simulates it, the engine does not model it\./)).toBeTruthy();
    expect(items[1].textContent).toMatch(/^Differential gain \|Ad\|, ICM 2 V, 85 °C: engine minus ngspice −7\.5 ?%/);
    expect(within(items[1]).getByText(/Likely saturation: SPICE finds Q4 \(VBC \+210 mV\)/)).toBeTruthy();
    expect(screen.getByText(/library card/).textContent).toMatch(/FH4N10; the engine does not model its TNOM/);
  });

  test('when every figure agrees and no card was simulated, then nothing is shown', () => {
    const agreeing = option({ card: undefined, corners: [], nominal: { label: 'ICM 0 V, 27 °C', inputCommonModeV: 0, temperatureC: 27, figures: [figure({})] } });
    const { container } = render(<DifferenceCauses option={agreeing} />);
    expect(container.textContent).toBe('');
  });
});
