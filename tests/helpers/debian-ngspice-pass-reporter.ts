/**
 * A vitest reporter (vitest.config.ts, beside the default one) that ends every run touching the
 * Debian ngspice pass's files (debian-ngspice-project.ts) with one line saying whether that pass
 * ran, and why not when it did not, so that a run without Debian's ngspice does not pass for a
 * complete one.
 */
import { execFileSync } from 'node:child_process';
import type { Reporter, TestModule, Vitest } from 'vitest/node';
import { DEBIAN_NGSPICE_PATH, DEBIAN_NGSPICE_PROJECT, DEBIAN_NGSPICE_REFERENCE_FILES, debianNgspiceInstalled } from './debian-ngspice-project';

/** What the line needs to know about the machine. */
export interface DebianNgspiceState {
  installed: boolean;
  /** `ngspice -v`'s version word (e.g. "ngspice-39"), when installed. */
  version?: string;
}

/**
 * The line for a run, given the project of every module that ran one of the Debian pass's files
 * (in either project): null when none of those files ran.
 */
export function debianNgspicePassLine(projectsOfCoveredFiles: readonly string[], state: DebianNgspiceState): string | null {
  if (projectsOfCoveredFiles.length === 0) return null;
  const onDebian = projectsOfCoveredFiles.filter((project) => project === DEBIAN_NGSPICE_PROJECT).length;
  if (onDebian > 0) {
    return `Debian ngspice pass: on (${DEBIAN_NGSPICE_PATH}${state.version ? `, ${state.version}` : ''}), ${onDebian} reference test file${onDebian === 1 ? '' : 's'}`;
  }
  if (state.installed) return `Debian ngspice pass: off — ${DEBIAN_NGSPICE_PATH} is installed but the ${DEBIAN_NGSPICE_PROJECT} project was not selected`;
  return `Debian ngspice pass: off — ${DEBIAN_NGSPICE_PATH} is not installed (apt-get install ngspice; .ci/run installs it), so the reference files ran on the registry's ngspice (eecircuit-engine) only`;
}

function installedVersion(): string | undefined {
  try {
    return /\bngspice-[0-9][^\s:]*/.exec(execFileSync(DEBIAN_NGSPICE_PATH, ['-v'], { encoding: 'utf8', timeout: 10_000 }))?.[0];
  } catch {
    return undefined;
  }
}

export default class DebianNgspicePassReporter implements Reporter {
  private vitest: Vitest | undefined;

  onInit(vitest: Vitest): void {
    this.vitest = vitest;
  }

  onTestRunEnd(testModules: ReadonlyArray<TestModule>): void {
    const covered = testModules.filter((module) => DEBIAN_NGSPICE_REFERENCE_FILES.some((file) => module.moduleId.replaceAll('\\', '/').endsWith(`/${file}`)));
    const projects = covered.map((module) => module.project.name);
    if (projects.length === 0) return;
    const installed = debianNgspiceInstalled();
    const line = debianNgspicePassLine(projects, { installed, version: installed ? installedVersion() : undefined });
    if (line !== null) this.vitest?.logger.log(line);
  }
}
