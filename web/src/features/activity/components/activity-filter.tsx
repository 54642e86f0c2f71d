import { useId } from 'react';
import { ACTIVITY_KIND_WORDS, ACTIVITY_KINDS, type ActivityKind } from '#shared/workflow/activity';
import type { ProjectMember } from '#shared/api/projects';
import type { ActivityView } from '../lib/activity-view';

const SELECT = 'min-w-0 max-w-full rounded-md border border-rule bg-sheet px-2 py-1.5 font-medium dark:border-night-rule dark:bg-night';

/**
 * "Show [every kind of event] by [everyone]": the filter as one sentence of two choices. A person
 * no longer on the project, chosen through the address, stays a choice under their number.
 */
export function ActivityFilter({ view, members, onChange }: { view: ActivityView; members: readonly ProjectMember[]; onChange: (changes: Partial<Pick<ActivityView, 'person' | 'kind'>>) => void }) {
  const id = useId();
  const former = view.person !== null && !members.some((m) => m.id === view.person);
  return (
    <form aria-label="Which events to show" onSubmit={(e) => e.preventDefault()} className="flex flex-wrap items-center gap-x-2 gap-y-2 text-sm">
      <label htmlFor={`${id}-kind`}>Show</label>
      <select id={`${id}-kind`} className={SELECT} value={view.kind ?? ''} onChange={(e) => onChange({ kind: (e.target.value || null) as ActivityKind | null })}>
        <option value="">every kind of event</option>
        {ACTIVITY_KINDS.map((kind) => (
          <option key={kind} value={kind}>
            {ACTIVITY_KIND_WORDS[kind].toLowerCase()}
          </option>
        ))}
      </select>
      <label htmlFor={`${id}-person`}>by</label>
      <select id={`${id}-person`} className={SELECT} value={view.person ?? ''} onChange={(e) => onChange({ person: e.target.value ? Number(e.target.value) : null })}>
        <option value="">everyone</option>
        {members.map((member) => (
          <option key={member.id} value={member.id}>
            {member.displayName}
          </option>
        ))}
        {former && <option value={view.person!}>person #{view.person}</option>}
      </select>
    </form>
  );
}
