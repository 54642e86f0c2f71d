import { describe, expect, test } from 'vitest';
import { debianNgspicePassLine } from '../../helpers/debian-ngspice-pass-reporter';

describe('the Debian ngspice pass line', () => {
  test('reference files in both projects: on, with the program, its version and the count', () => {
    expect(debianNgspicePassLine(['unit', 'reference-debian-ngspice', 'unit', 'reference-debian-ngspice', 'reference-debian-ngspice'], { installed: true, version: 'ngspice-39' })).toBe(
      'Debian ngspice pass: on (/usr/bin/ngspice, ngspice-39), 3 reference test files',
    );
  });

  test('not installed: off, saying so and how to install it', () => {
    expect(debianNgspicePassLine(['unit'], { installed: false })).toBe(
      "Debian ngspice pass: off — /usr/bin/ngspice is not installed (apt-get install ngspice; .ci/run installs it), so the reference files ran on the registry's ngspice (eecircuit-engine) only",
    );
  });

  test('installed but the project filtered out: off, saying why', () => {
    expect(debianNgspicePassLine(['unit', 'unit'], { installed: true, version: 'ngspice-39' })).toBe(
      'Debian ngspice pass: off — /usr/bin/ngspice is installed but the reference-debian-ngspice project was not selected',
    );
  });

  test('none of the pass\'s files in the run: no line', () => {
    expect(debianNgspicePassLine([], { installed: true, version: 'ngspice-39' })).toBeNull();
    expect(debianNgspicePassLine([], { installed: false })).toBeNull();
  });
});
