import type { QueryClient } from '@tanstack/react-query';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { RouteError } from '../components/layout/route-error';
import { PageHeader } from '../components/ui/page-header';
import { resultsQuery, SearchResults } from '../features/search/components/search-results';
import { readSearchView } from '../features/search/lib/search-view';

/** Asks for the address's results (not waited for: the page shows its own progress, and the previous page stays while a new one comes). */
export const loader =
  (queryClient: QueryClient) =>
  ({ request }: LoaderFunctionArgs) => {
    const view = readSearchView(new URL(request.url).searchParams);
    if (view.q !== '') void queryClient.prefetchQuery(resultsQuery(view));
    return null;
  };

/** The search's results: every kind's best matches, or one kind's pages, only what the person may see. */
export function Component() {
  const [params] = useSearchParams();
  const view = readSearchView(params);
  return (
    <>
      <PageHeader title="Search">{view.q ? <>Results for “{view.q}” among the projects, specs, proposals and people you can see.</> : 'Projects, specs, proposals and people you can see.'}</PageHeader>
      <SearchResults view={view} />
    </>
  );
}

export const ErrorBoundary = RouteError;
