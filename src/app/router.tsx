import { createBrowserRouter, Outlet, ScrollRestoration, type RouteObject } from 'react-router';
import { Loading } from '@/components/ProgressBar';
import { AppLayout, PublicLayout } from './layout';
import { RequireSignIn, RoleGate } from './guards';
import { RouteError } from './pages/RouteError';
import { NotFoundPage } from './pages/NotFoundPage';
import { publicRoutes, routes, type AppRoute } from './routes';

function Root() {
  return (
    <>
      <ScrollRestoration />
      <Outlet />
    </>
  );
}

function signedInRoute(route: AppRoute): RouteObject {
  const page: RouteObject = { path: route.path, lazy: route.lazy };
  if (!route.roles) return page;
  return { element: <RoleGate roles={route.roles} />, children: [page] };
}

/** The whole route tree; `router` below is the browser router, tests build a memory router from the same tree. */
export function appRouteObjects(registry: readonly AppRoute[] = routes): RouteObject[] {
  return [
    {
      id: 'root',
      element: <Root />,
      errorElement: <RouteError />,
      hydrateFallbackElement: <Loading label="Opening Wirewalk" />,
      children: [
        {
          element: <PublicLayout />,
          children: [{ errorElement: <RouteError />, children: publicRoutes.map((r) => ({ path: r.path, lazy: r.lazy })) }],
        },
        {
          element: (
            <RequireSignIn>
              <AppLayout />
            </RequireSignIn>
          ),
          children: [
            {
              // Errors in a page show inside the layout, so the navigation stays.
              errorElement: <RouteError />,
              children: [
                { index: true, lazy: () => import('./pages/HomePage') },
                ...registry.map(signedInRoute),
                { path: '*', element: <NotFoundPage /> },
              ],
            },
          ],
        },
      ],
    },
  ];
}

export const createAppRouter = () => createBrowserRouter(appRouteObjects());
