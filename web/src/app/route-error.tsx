import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { paths } from '../config/paths';
import { ApiError } from '../lib/api';

/** The root error boundary: a route error response, an Error, or something unknown. */
export function RouteError() {
  const error = useRouteError();
  let title = 'Something went wrong';
  let message = 'An unexpected error stopped this page.';
  if (isRouteErrorResponse(error)) {
    title = error.status === 404 ? 'Not found' : `Error ${error.status}`;
    message = error.status === 404 ? 'There is nothing at this address, or it belongs to a project you are not part of.' : String(error.statusText ?? '');
  } else if (error instanceof ApiError) {
    title = error.status === 404 ? 'Not found' : error.status === 403 ? 'Not allowed' : 'The server refused this';
    message = error.message;
  } else if (error instanceof Error) {
    message = error.message;
  }
  return (
    <div role="alert" className="mx-auto max-w-xl py-16">
      <h1 className="text-2xl font-medium">{title}</h1>
      <p className="mt-2 text-ink-soft dark:text-night-ink-soft">{message}</p>
      <Link to={paths.workbench.href()} className="mt-4 inline-block text-fern underline dark:text-fern-bright">
        Back to the workbench
      </Link>
    </div>
  );
}
