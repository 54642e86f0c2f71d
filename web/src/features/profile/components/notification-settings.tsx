import { useState } from 'react';
import type { User } from '#shared/api/users';
import { NOTICES, knownNoticesOff, type NoticeKind } from '#shared/workflow/notices';
import { useUpdatePreferences } from '../api/preferences';

/** What the last save said, in words (the status line). */
type Saved = { what: 'all'; on: boolean } | { what: 'kind'; kind: NoticeKind; on: boolean };

const titleOf = (kind: NoticeKind) => NOTICES.find((notice) => notice.kind === kind)?.title ?? kind;

/**
 * The e-mail settings: the master switch (no workflow e-mail at all when off) and one switch per
 * kind of notice, each with its description (shared/workflow/notices.ts, the server's own list).
 * Each click is saved at once; the switches show what the server holds once the save settles.
 */
export function NotificationSettings({ user }: { user: User }) {
  const update = useUpdatePreferences();
  // A switch follows the click at once (a controlled box would otherwise spring back until the
  // request's answer arrives) and returns to what the server holds once the save settles.
  const [askedOn, setAskedOn] = useState<boolean | null>(null);
  const [askedOff, setAskedOff] = useState<NoticeKind[] | null>(null);
  const [saved, setSaved] = useState<Saved | null>(null);
  const on = askedOn ?? user.notify !== false;
  const off = askedOff ?? knownNoticesOff(user.noticesOff);

  const saveMaster = (next: boolean) => {
    setAskedOn(next);
    setSaved(null);
    update.mutate({ notify: next }, { onSuccess: () => setSaved({ what: 'all', on: next }), onSettled: () => setAskedOn(null) });
  };
  const saveKind = (kind: NoticeKind, next: boolean) => {
    const list = next ? off.filter((k) => k !== kind) : [...off, kind];
    setAskedOff(list);
    setSaved(null);
    update.mutate({ noticesOff: list }, { onSuccess: () => setSaved({ what: 'kind', kind, on: next }), onSettled: () => setAskedOff(null) });
  };

  return (
    <div>
      <label className="flex items-start gap-3">
        <input
          type="checkbox"
          checked={on}
          disabled={update.isPending}
          onChange={(event) => saveMaster(event.target.checked)}
          aria-describedby="notify-help"
          className="mt-1 h-4 w-4 shrink-0 accent-fern"
        />
        <span>
          <span className="block font-medium">E-mail me about the workflow</span>
          <span id="notify-help" className="block text-sm text-ink-soft dark:text-night-ink-soft">
            Sent to {user.email}. Nobody gets an e-mail about what they did themselves, and only about projects they belong to.
          </span>
        </span>
      </label>
      <fieldset className="mt-4" aria-describedby="notice-kinds-help">
        <legend className="text-sm font-medium">Which e-mails</legend>
        <p id="notice-kinds-help" className="text-sm text-ink-soft dark:text-night-ink-soft">
          {on
            ? 'Turn off the kinds you do not want; the others keep coming. Several within a minute come as one e-mail.'
            : 'E-mail is off, so none of these comes, whatever its switch says; each project page still shows what needs you. Turn e-mail on to choose.'}
        </p>
        <ul className="mt-2 grid gap-2">
          {NOTICES.map((notice) => {
            const kindOn = !off.includes(notice.kind);
            const helpId = `notice-${notice.kind.replace(/\W/g, '-')}-help`;
            return (
              <li key={notice.kind}>
                <label className="flex items-start gap-3">
                  <input
                    type="checkbox"
                    role="switch"
                    checked={kindOn}
                    disabled={!on || update.isPending}
                    onChange={(event) => saveKind(notice.kind, event.target.checked)}
                    aria-describedby={helpId}
                    className="mt-1 h-4 w-4 shrink-0 accent-fern"
                  />
                  <span>
                    <span className="block text-sm font-medium">{notice.title}</span>
                    <span id={helpId} className="block text-sm text-ink-soft dark:text-night-ink-soft">
                      {notice.description}
                    </span>
                  </span>
                </label>
              </li>
            );
          })}
        </ul>
      </fieldset>
      <p role="status" aria-live="polite" className="mt-3 min-h-5 text-sm">
        {update.isPending
          ? 'Saving…'
          : saved?.what === 'all'
            ? saved.on
              ? 'Saved: e-mail is on.'
              : 'Saved: e-mail is off.'
            : saved?.what === 'kind'
              ? `Saved: “${titleOf(saved.kind)}” e-mails are ${saved.on ? 'on' : 'off'}.`
              : null}
      </p>
      {update.error && (
        <p role="alert" className="text-sm text-short dark:text-short-bright">
          Not saved: {update.error.message}
        </p>
      )}
    </div>
  );
}
