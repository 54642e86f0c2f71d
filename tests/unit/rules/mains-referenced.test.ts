import { testRuleCases } from '../../helpers/rule-cases';

// Advisory caution for mains-referenced inputs (isolation, creepage).
testRuleCases('mains-referenced', { severity: 'advisory' }, [
  {
    title: 'passes when not mains-referenced',
    overrides: {},
    passed: true,
    margin: null,
    texts: ['not mark the input as mains-referenced'],
  },
  {
    title: 'cautions when mains-referenced',
    overrides: { mainsReferenced: true },
    passed: false,
    margin: null,
    texts: ['Caution', 'isolation, creepage', 'applicable standard, local codes and licensed practice'],
  },
]);
