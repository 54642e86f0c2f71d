/** Readable names of the rule set's checks (rules/<rule-id>.json); an unknown id is shown as it is. */
const RULE_NAMES: Readonly<Record<string, string>> = {
  'cmrr-target': 'Rejection, tail-limited',
  'cmrr-differential-worst-case': 'Rejection, mismatch worst case',
  'cmrr-yield': 'Monte Carlo yield',
  'gain-tolerance': 'Gain within tolerance (nominal)',
  'gain-over-conditions': 'Gain over temperature and input range',
  'gain-vs-common-mode': 'Gain across input common mode',
  'hazardous-voltage': 'Rail voltage',
  'input-common-mode-high': 'Input common mode, high end',
  'input-common-mode-low': 'Input common mode, low end',
  'mains-referenced': 'Mains-referenced input',
  'operating-point': 'Operating point',
  'output-swing': 'Output swing',
  'patient-connected': 'Patient-connected input',
  'power-budget': 'Power budget',
  'tail-current-drift': 'Tail current drift',
};

export function ruleName(rule: string): string {
  return RULE_NAMES[rule] ?? rule;
}
