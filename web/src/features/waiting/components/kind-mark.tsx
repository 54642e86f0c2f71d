import { STATE_LABELS, STATE_TONES, StateGlyph, type StateLook } from '../../../components/ui/state-badge';
import type { WaitingKind } from '#shared/workflow/waiting';

/** A spec to rank: a sheet with a folded corner and two lines of figures (12 × 12 units, as the state marks). */
function SheetMark() {
  return (
    <svg viewBox="0 0 12 12" aria-hidden="true" data-mark="sheet" className="h-3 w-3 shrink-0 overflow-visible" fill="none" stroke="currentColor" strokeWidth="1.3" strokeLinecap="round" strokeLinejoin="round">
      <path d="M2 .8h5.5L10 3.3v7.9H2z" />
      <path d="M7.5.8v2.5H10M4 6h4M4 8.5h4" />
    </svg>
  );
}

/** Each kind drawn as the state its proposals are in (a spec to rank has a mark of its own). */
const KIND_LOOKS: Record<Exclude<WaitingKind, 'rank'>, StateLook> = {
  decide: STATE_LABELS.ranked,
  rework: STATE_LABELS.returned,
  review: STATE_LABELS.decided,
};

/** The kind's tone classes (text colour and left rule). */
export function kindTone(kind: WaitingKind): string {
  return kind === 'rank' ? STATE_TONES.accent : KIND_LOOKS[kind].className;
}

/** The kind's mark, hidden from assistive technology (the heading says the kind). */
export function KindMark({ kind }: { kind: WaitingKind }) {
  return kind === 'rank' ? <SheetMark /> : <StateGlyph glyph={KIND_LOOKS[kind].glyph} />;
}
