/** The numeric fields ENGINE-CONTRACT.md requires in every `analyze` output (besides cmrrDb, cmrrCornerHz, warnings). */
export const CONTRACT_NUMBER_FIELDS = [
  'tailCurrentA',
  'collectorCurrentA',
  'collectorVoltageV',
  'tailNodeVoltageV',
  'transconductanceS',
  'tailOutputResistanceOhm',
  'differentialGain',
  'singleEndedGain',
  'commonModeGain',
  'differentialCommonModeGain',
  'powerW',
] as const;

/** Every field the contract requires in an `analyze` output. */
export const CONTRACT_FIELDS = [...CONTRACT_NUMBER_FIELDS, 'cmrrDb', 'cmrrCornerHz', 'warnings'] as const;
