import { data } from 'react-router-dom';

/** A project id from the URL; anything else names no project (404). */
export function projectIdFrom(value: string | undefined): number {
  const id = Number(value);
  if (!Number.isInteger(id) || id < 1) throw data('No such project', { status: 404 });
  return id;
}
