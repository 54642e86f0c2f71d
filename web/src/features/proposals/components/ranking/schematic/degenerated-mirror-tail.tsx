import { TwoTransistorMirror } from './two-transistor-mirror';

/** Degenerated mirror: the simple mirror with equal resistors RE3 and RE4 in the emitters. */
export function DegeneratedMirrorTail({ referenceResistanceOhm, emitterResistanceOhm }: { referenceResistanceOhm: number; emitterResistanceOhm: number }) {
  return <TwoTransistorMirror referenceOhm={referenceResistanceOhm} re3Ohm={emitterResistanceOhm} re4Ohm={emitterResistanceOhm} />;
}
