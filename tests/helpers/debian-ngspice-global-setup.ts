/**
 * Vitest globalSetup of the `reference-debian-ngspice` project (vitest.config.ts): checks once
 * that Debian's ngspice runs (one clear failure instead of one per test) and says which version
 * answers.
 */
import { debianNgspiceVersion } from './debian-ngspice';
import { DEBIAN_NGSPICE_PATH } from './debian-ngspice-project';

export async function setup(): Promise<void> {
  let version: string;
  try {
    version = await debianNgspiceVersion();
  } catch (error) {
    throw new Error(`reference-debian-ngspice: ${DEBIAN_NGSPICE_PATH} does not run: ${error instanceof Error ? error.message : String(error)}`);
  }
  console.log(`reference-debian-ngspice: ${DEBIAN_NGSPICE_PATH} (${version})`);
}
