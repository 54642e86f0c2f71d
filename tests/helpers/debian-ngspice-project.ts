/**
 * The Debian ngspice pass, as vitest.config.ts defines it: the reference files run a second time
 * in their own project, their ngspice being Debian's program (/usr/bin/ngspice)
 * instead of the registry's WebAssembly build. The project exists only where that program is
 * installed, so a machine without it shows no skipped tests; the pass's reporter
 * (debian-ngspice-pass-reporter.ts) says in one line whether it ran. Node built-ins only: the
 * config file imports this module.
 */
import { accessSync, constants } from 'node:fs';

/** Where Debian's package (`apt-get install ngspice`) installs ngspice. */
export const DEBIAN_NGSPICE_PATH = '/usr/bin/ngspice';

export const DEBIAN_NGSPICE_PROJECT = 'reference-debian-ngspice';

/**
 * The files the pass runs again, named one by one (a new reference file joins when it should
 * hold on both builds): the reference simulator's own check on closed-form circuits; `analyze`
 * against ngspice with full model cards at DC and over frequency up to the gain's −20 dB point
 * (every topology, −40, 27 and 125 °C) and with saturated tails; and the three-parameter
 * reference files (every topology over corners, gm and saturation, the smallest resistances); what
 * limits the rejection, each part removed or changed in the netlist; every topology's netlists
 * run against hand formulas; the input-referred noise against `.noise` (Debian's batch mode
 * writes the noise density plot first in its raw file, which the reader takes) and a handbook
 * formula; the slew rate against `.tran`; the MOS level-1 device on single transistors. Every
 * file of tests/reference is listed today (tests/unit/helpers/debian-ngspice-files.test.ts holds
 * it so).
 */
export const DEBIAN_NGSPICE_REFERENCE_FILES = [
  'tests/reference/spice-runner.test.ts',
  'tests/reference/full-model-dc.test.ts',
  'tests/reference/frequency-agreement.test.ts',
  'tests/reference/saturated-tail-agreement.test.ts',
  'tests/reference/spice-agreement.test.ts',
  'tests/reference/saturation-and-transconductance.test.ts',
  'tests/reference/smallest-resistances.test.ts',
  'tests/reference/rejection-limits-agreement.test.ts',
  'tests/reference/netlist-runs.test.ts',
  'tests/reference/input-figures-agreement.test.ts',
  'tests/reference/noise-agreement.test.ts',
  'tests/reference/slew-agreement.test.ts',
  'tests/reference/mos-device-agreement.test.ts',
  'tests/reference/pnp-pair-agreement.test.ts',
  'tests/reference/mos-pair-agreement.test.ts',
] as const;

/** Whether Debian's ngspice is installed (an executable at `path`). */
export function debianNgspiceInstalled(path: string = DEBIAN_NGSPICE_PATH): boolean {
  try {
    accessSync(path, constants.X_OK);
    return true;
  } catch {
    return false;
  }
}
