import type { MarkedText as Pieces } from '#shared/api/search';

/** Text from the search with the matched words marked; every piece is rendered as text, never as markup. */
export function MarkedText({ pieces }: { pieces: Pieces }) {
  return (
    <>
      {pieces.map((piece, i) =>
        piece.marked ? (
          <mark key={i} className="rounded-[2px] bg-note-soft px-px text-ink underline decoration-note/60 decoration-1 underline-offset-2 dark:bg-note/25 dark:text-night-ink dark:decoration-note-bright/70">
            {piece.text}
          </mark>
        ) : (
          piece.text
        ),
      )}
    </>
  );
}
