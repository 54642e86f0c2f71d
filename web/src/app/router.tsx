import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, redirect, type LoaderFunction, type RouteObject } from 'react-router-dom';
import { AppShell } from '../components/layout/app-shell';
import { Loading } from '../components/ui/feedback';
import { paths } from '../config/paths';
import { meQuery } from '../lib/auth-queries';
import { loader as proposalLoader } from '../routes/proposal-loader';
import { NotFound, RouteError } from '../components/layout/route-error';

/** What a route module exports (bulletproof-react style): loader and action are bound to the one QueryClient. */
interface RouteModule {
  Component: React.ComponentType;
  loader?: (queryClient: QueryClient) => LoaderFunction;
  ErrorBoundary?: React.ComponentType;
}

/** Lazy-loads a route module and binds its loader to the QueryClient. */
function lazyRoute(queryClient: QueryClient, load: () => Promise<RouteModule>): RouteObject['lazy'] {
  return async () => {
    const module = await load();
    return { Component: module.Component, loader: module.loader?.(queryClient), ErrorBoundary: module.ErrorBoundary };
  };
}

/** The app's routes (exported so a test can mount them in a memory router). */
export function appRoutes(queryClient: QueryClient): RouteObject[] {
  const requireUser: LoaderFunction = async ({ request }) => {
    const user = await queryClient.ensureQueryData(meQuery());
    if (!user) {
      const url = new URL(request.url);
      throw redirect(paths.signIn.href(url.pathname + url.search));
    }
    return null;
  };
  return [
    { path: paths.signIn.path, lazy: lazyRoute(queryClient, () => import('../routes/sign-in')), errorElement: <RouteError />, hydrateFallbackElement: <Loading what="Opening Longtail" /> },
    { path: paths.passwordReset.path, lazy: lazyRoute(queryClient, () => import('../routes/password-reset')), errorElement: <RouteError />, hydrateFallbackElement: <Loading what="Opening Longtail" /> },
    {
      path: '/',
      element: <AppShell />,
      loader: requireUser,
      hydrateFallbackElement: <Loading what="Opening Longtail" />,
      errorElement: <RouteError />,
      children: [
        { index: true, lazy: lazyRoute(queryClient, () => import('../routes/home')) },
        { path: paths.project.path, lazy: lazyRoute(queryClient, () => import('../routes/project')) },
        { path: paths.activity.path, lazy: lazyRoute(queryClient, () => import('../routes/project-activity')) },
        { path: paths.newSpec.path, lazy: lazyRoute(queryClient, () => import('../routes/spec-new')) },
        { path: paths.specImport.path, lazy: lazyRoute(queryClient, () => import('../routes/spec-import')) },
        { path: paths.spec.path, lazy: lazyRoute(queryClient, () => import('../routes/spec')) },
        { path: paths.specHistory.path, lazy: lazyRoute(queryClient, () => import('../routes/spec-history')) },
        // The ranking page's loader is in the entry, so its data is asked for while its module loads.
        { path: paths.proposal.path, loader: proposalLoader(queryClient), lazy: lazyRoute(queryClient, () => import('../routes/proposal')) },
        { path: paths.report.path, lazy: lazyRoute(queryClient, () => import('../routes/proposal-report')) },
        { path: paths.compare.path, lazy: lazyRoute(queryClient, () => import('../routes/compare')) },
        { path: paths.people.path, lazy: lazyRoute(queryClient, () => import('../routes/people')) },
        { path: paths.search.path, lazy: lazyRoute(queryClient, () => import('../routes/search')) },
        { path: paths.profile.path, lazy: lazyRoute(queryClient, () => import('../routes/profile')) },
        { path: paths.mail.path, lazy: lazyRoute(queryClient, () => import('../routes/mail')) },
        // Any other address: a page of its own that says so (not the error page).
        { path: '*', element: <NotFound /> },
      ],
    },
  ];
}

export function createRouter(queryClient: QueryClient) {
  return createBrowserRouter(appRoutes(queryClient));
}
