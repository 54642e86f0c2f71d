import type { RecommendOption } from '#shared/engine/recommend';

/**
 * How the engine sized the option, and what it warns about (solver errors included); when the
 * spec was filled from a library card, what the engine leaves out of that card (SPICE simulates it).
 */
export function OptionNotes({ option, card = null }: { option: RecommendOption; card?: { name: string; notes: string[] } | null }) {
  const warnings = [...(option.error ? [`Not solved: ${option.error}`] : []), ...(option.predicted?.warnings ?? [])];
  return (
    <div className="grid gap-6 md:grid-cols-2">
      <section aria-labelledby="sizing-notes-title">
        <h3 id="sizing-notes-title" className="mb-1 text-sm font-medium">
          How it was sized
        </h3>
        {option.sizingNotes.length === 0 ? (
          <p className="text-sm text-ink-soft dark:text-night-ink-soft">No sizing notes.</p>
        ) : (
          <ol className="list-decimal space-y-1 pl-5 text-sm">
            {option.sizingNotes.map((note) => (
              <li key={note}>{note}</li>
            ))}
          </ol>
        )}
      </section>
      <section aria-labelledby="warnings-title">
        <h3 id="warnings-title" className="mb-1 text-sm font-medium">
          Warnings at nominal conditions
        </h3>
        {warnings.length === 0 ? (
          <p className="text-sm text-ink-soft dark:text-night-ink-soft">
            None.
          </p>
        ) : (
          <ul className="space-y-1 text-sm">
            {warnings.map((w) => (
              <li key={w} className="flex gap-1.5 text-note dark:text-note-bright">
                <span aria-hidden="true">!</span>
                <span>{w}</span>
              </li>
            ))}
          </ul>
        )}
      </section>
      {card && (
        <section aria-labelledby="card-notes-title" className="md:col-span-2" data-card-notes>
          <h3 id="card-notes-title" className="mb-1 text-sm font-medium">
            Device card {card.name}
          </h3>
          {card.notes.length === 0 ? (
            <p className="text-sm text-ink-soft dark:text-night-ink-soft">The engine models every parameter of the card; SPICE simulates the same card.</p>
          ) : (
            <ul className="space-y-1 text-sm">
              {card.notes.map((note) => (
                <li key={note}>{note}</li>
              ))}
            </ul>
          )}
        </section>
      )}
    </div>
  );
}
