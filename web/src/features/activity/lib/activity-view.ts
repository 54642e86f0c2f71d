/**
 * A project's activity view as it lives in the URL (`?person=7&kind=decisions&page=2`): read
 * leniently (anything unknown means everyone, every kind, page 1), written minimally (defaults
 * omitted), and the same filter as the API's query (`actor`, `kind`, `page`, `pageSize`).
 */
import { ACTIVITY_KINDS, type ActivityKind } from '#shared/workflow/activity';

export interface ActivityView {
  person: number | null;
  kind: ActivityKind | null;
  page: number;
}

const positive = (text: string | null) => {
  const n = Number(text ?? '');
  return Number.isInteger(n) && n >= 1 ? n : null;
};

export function readActivityView(params: URLSearchParams): ActivityView {
  const kind = params.get('kind');
  return { person: positive(params.get('person')), kind: ACTIVITY_KINDS.includes(kind as ActivityKind) ? (kind as ActivityKind) : null, page: positive(params.get('page')) ?? 1 };
}

/** The search params for a view, keeping any unrelated params. */
export function writeActivityView(params: URLSearchParams, view: ActivityView): URLSearchParams {
  const next = new URLSearchParams(params);
  const set = (key: string, value: string | null) => (value === null ? next.delete(key) : next.set(key, value));
  set('person', view.person === null ? null : String(view.person));
  set('kind', view.kind);
  set('page', view.page === 1 ? null : String(view.page));
  return next;
}

/** The API's query for the view: its filters, and with `pageSize` its page (`?actor=7&kind=decisions&page=2&pageSize=25`). */
export function activityApiQuery(view: ActivityView, pageSize?: number): string {
  const query = new URLSearchParams();
  if (view.person !== null) query.set('actor', String(view.person));
  if (view.kind) query.set('kind', view.kind);
  if (pageSize !== undefined) {
    query.set('page', String(view.page));
    query.set('pageSize', String(pageSize));
  }
  const text = query.toString();
  return text ? `?${text}` : '';
}
