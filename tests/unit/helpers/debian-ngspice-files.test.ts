/**
 * The Debian ngspice pass names its files one by one; a reference file left off that list would
 * hold on the registry's ngspice only, without anyone deciding so. Every file of tests/reference
 * is on it, and every listed file exists.
 */
import { readdirSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import { DEBIAN_NGSPICE_REFERENCE_FILES } from '../../helpers/debian-ngspice-project';

describe('the files of the Debian ngspice pass', () => {
  test('are exactly the reference test files', () => {
    const onDisk = readdirSync('tests/reference')
      .filter((name) => name.endsWith('.test.ts'))
      .map((name) => `tests/reference/${name}`)
      .sort();
    expect([...DEBIAN_NGSPICE_REFERENCE_FILES].sort()).toEqual(onDisk);
  });
});
