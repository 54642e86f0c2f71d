import { testRuleCases } from '../../helpers/rule-cases';

// Advisory caution for mains-referenced inputs (isolation, creepage).
testRuleCases('mains-referenced', { severity: 'advisory' }, [
  {
    title: 'does not apply (n/a, never "holds") when not mains-referenced',
    overrides: {},
    passed: true,
    margin: null,
    texts: ['Not applicable', 'not mark the input as mains-referenced'],
    applicable: false,
  },
  {
    title: 'cautions when mains-referenced',
    overrides: { mainsReferenced: true },
    passed: false,
    margin: null,
    applicable: true,
    texts: ['Caution', 'isolation, creepage', 'applicable standard, local codes and licensed practice'],
  },
]);
