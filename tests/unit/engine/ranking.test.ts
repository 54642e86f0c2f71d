import { describe, expect, test } from 'vitest';
import { rankOptions, recommendedTopology, type Rankable } from '#shared/engine/ranking';

// The ranking and the two selection policies as the user documentation states them
// (docs/command-line.md "policy", DEVELOPERS.md "How the engine computes"): passing options
// first, then higher tail impedance, then the simpler topology (catalogue order: resistor,
// simple mirror, degenerated mirror, Widlar, Wilson, cascode); `simplest-sufficient` recommends
// the simplest passing option, `highest-rejection` the passing option with the highest rejection.

function option(topology: Rankable['topology'], passes: boolean, tailImpedanceAtFrequencyOhm: number, rejectionDb: number): Rankable {
  return { topology, passes, tailImpedanceAtFrequencyOhm, rejectionDb };
}

describe('rankOptions', () => {
  test('passing first, then higher tail impedance, then simpler', () => {
    const options = [
      option('cascode', false, 1e9, 140),
      option('wilson', true, 1e6, 110),
      option('widlar', true, 5e6, 120),
      option('simple-mirror', true, 1e6, 100),
      option('resistor', false, 1e4, 60),
    ];
    expect(rankOptions(options).map((o) => o.topology)).toEqual(['widlar', 'simple-mirror', 'wilson', 'cascode', 'resistor']);
  });

  test('equal impedances keep catalogue order whatever the input order', () => {
    const options = [option('cascode', true, 1e6, 100), option('resistor', true, 1e6, 100), option('wilson', true, 1e6, 100)];
    expect(rankOptions(options).map((o) => o.topology)).toEqual(['resistor', 'wilson', 'cascode']);
    expect(rankOptions([...options].reverse()).map((o) => o.topology)).toEqual(['resistor', 'wilson', 'cascode']);
  });

  test('does not reorder the caller\u2019s array', () => {
    const options = [option('resistor', false, 1, 0), option('cascode', true, 2, 0)];
    rankOptions(options);
    expect(options.map((o) => o.topology)).toEqual(['resistor', 'cascode']);
  });
});

describe('recommendedTopology', () => {
  const options = [
    option('cascode', true, 1e9, 130),
    option('widlar', true, 5e6, 118),
    option('degenerated-mirror', true, 2e6, 121),
    option('wilson', true, 4e8, 125),
    option('resistor', false, 1e4, 140), // the highest rejection, but failing: never recommended
    option('simple-mirror', false, 1e6, 95),
  ];

  test('simplest-sufficient: the simplest passing option, wherever it stands in the list', () => {
    expect(recommendedTopology(options, 'simplest-sufficient')).toBe('degenerated-mirror');
    expect(recommendedTopology([...options].reverse(), 'simplest-sufficient')).toBe('degenerated-mirror');
  });

  test('highest-rejection: the passing option with the highest rejection, wherever it stands', () => {
    expect(recommendedTopology(options, 'highest-rejection')).toBe('cascode');
    expect(recommendedTopology([...options].reverse(), 'highest-rejection')).toBe('cascode');
  });

  test('a tie in rejection goes to the option listed first', () => {
    const tied = [option('wilson', true, 1, 120), option('cascode', true, 1, 120)];
    expect(recommendedTopology(tied, 'highest-rejection')).toBe('wilson');
  });

  test('none passing: no recommendation under either policy', () => {
    const failing = options.map((o) => ({ ...o, passes: false }));
    expect(recommendedTopology(failing, 'simplest-sufficient')).toBeNull();
    expect(recommendedTopology(failing, 'highest-rejection')).toBeNull();
  });
});
