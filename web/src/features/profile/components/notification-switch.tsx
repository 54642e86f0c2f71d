import { useState } from 'react';
import { heldRoles, type Role } from '#shared/workflow/roles';
import type { User } from '#shared/api/users';
import { useUpdatePreferences } from '../api/preferences';

/** Which workflow e-mails each role gets in the projects where one holds it (the server's rules, api/services/notifications.service.ts, in words). */
const WHAT_YOU_GET: Record<Role, string[]> = {
  designer: ['A proposal in a project where you design is ranked and waits for a decision.', 'A reviewer approves or returns your decision.'],
  reviewer: ['A designer records a decision in a project where you review, so it waits for review.'],
  requirements: ['A reviewer approves or returns a proposal of a spec you wrote.'],
  admin: ['None for the administrator role: workflow e-mail goes to the designers, reviewers and spec authors of each project.'],
};

/** The e-mail switch: saved at once; the box shows what the server holds. */
export function NotificationSwitch({ user }: { user: User }) {
  const lines = heldRoles(user).flatMap((role) => WHAT_YOU_GET[role]);
  const update = useUpdatePreferences();
  // The box follows the click at once (a controlled box would otherwise spring back until the
  // request's state arrives) and returns to what the server holds once the save settles.
  const [asked, setAsked] = useState<boolean | null>(null);
  const on = asked ?? user.notify !== false;
  return (
    <div>
      <label className="flex items-start gap-3">
        <input
          type="checkbox"
          checked={on}
          disabled={update.isPending}
          onChange={(event) => {
            const notify = event.target.checked;
            setAsked(notify);
            update.mutate({ notify }, { onSettled: () => setAsked(null) });
          }}
          aria-describedby="notify-help"
          className="mt-1 h-4 w-4 accent-fern"
        />
        <span>
          <span className="block font-medium">E-mail me about the workflow</span>
          <span id="notify-help" className="block text-sm text-ink-soft dark:text-night-ink-soft">
            Sent to {user.email}. Nobody gets an e-mail about what they did themselves.
          </span>
        </span>
      </label>
      <p className="mt-3 text-sm">{on ? 'You get an e-mail when:' : 'It is off: Longtail sends you no workflow e-mail; each project page still shows what needs you. Turned on, you would get one when:'}</p>
      <ul className="mt-1 list-disc pl-5 text-sm text-ink-soft dark:text-night-ink-soft">
        {(lines.length > 0 ? lines : ['Nothing yet: you hold no role in a project.']).map((line) => (
          <li key={line}>{line}</li>
        ))}
      </ul>
      <p role="status" aria-live="polite" className="mt-3 min-h-5 text-sm">
        {update.isPending ? 'Saving…' : update.isSuccess ? (on ? 'Saved: e-mail is on.' : 'Saved: e-mail is off.') : null}
      </p>
      {update.error && (
        <p role="alert" className="text-sm text-short dark:text-short-bright">
          Not saved: {update.error.message}
        </p>
      )}
    </div>
  );
}
