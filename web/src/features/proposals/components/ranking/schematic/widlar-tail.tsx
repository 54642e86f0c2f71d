import { TwoTransistorMirror } from './two-transistor-mirror';

/** Widlar source: the simple mirror with an emitter resistor RE4 on Q4 only. */
export function WidlarTail({ referenceResistanceOhm, emitterResistanceOhm }: { referenceResistanceOhm: number; emitterResistanceOhm: number }) {
  return <TwoTransistorMirror referenceOhm={referenceResistanceOhm} re4Ohm={emitterResistanceOhm} />;
}
