import { isRouteErrorResponse, Link, useLocation, useRouteError } from 'react-router-dom';
import { paths } from '../../config/paths';
import { ApiError } from '../../lib/api';

function Message({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <div role="alert" className="mx-auto max-w-xl py-16">
      <h1 className="text-2xl font-medium">{title}</h1>
      <div className="mt-2 text-ink-soft dark:text-night-ink-soft">{children}</div>
      <Link to={paths.home.href()} className="mt-4 inline-block text-fern underline dark:text-fern-bright">
        Back to your projects
      </Link>
    </div>
  );
}

/** An address the app has no page for: says so and where to go, never "something went wrong". */
export function NotFound() {
  const { pathname } = useLocation();
  return (
    <Message title="Page not found">
      <p>
        Longtail has no page at <code className="font-mono text-sm break-all">{pathname}</code>. Check the address, or start again from your projects.
      </p>
    </Message>
  );
}

/** The root error boundary: a route error response, an Error, or something unknown. */
export function RouteError() {
  const error = useRouteError();
  let title = 'Something went wrong';
  let message = 'An unexpected error stopped this page.';
  if (isRouteErrorResponse(error)) {
    if (error.status === 404) return <NotFound />;
    title = `Error ${error.status}`;
    message = String(error.statusText ?? '');
  } else if (error instanceof ApiError) {
    title = error.status === 404 ? 'Not found' : error.status === 403 ? 'Not allowed' : 'The server refused this';
    message = error.message;
  } else if (error instanceof Error) {
    message = error.message;
  }
  return (
    <Message title={title}>
      <p>{message}</p>
    </Message>
  );
}
