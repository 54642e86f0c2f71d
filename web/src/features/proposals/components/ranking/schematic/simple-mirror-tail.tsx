import { TwoTransistorMirror } from './two-transistor-mirror';

/** Simple mirror: Q3 diode-connected fed through RREF, Q4 mirrors it into t. */
export function SimpleMirrorTail({ referenceResistanceOhm }: { referenceResistanceOhm: number }) {
  return <TwoTransistorMirror referenceOhm={referenceResistanceOhm} />;
}
