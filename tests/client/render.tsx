/**
 * Renders the real app (routes, layout, guards, lazy pages) in a memory
 * router at `path`, with a fresh query client. Use with installFakeApi().
 */
import { render } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router';
import { Providers } from '@/app/providers';
import { createQueryClient } from '@/app/query-client';
import { appRouteObjects } from '@/app/router';

export function renderApp(path: string) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRouteObjects(), { initialEntries: [path] });
  const utils = render(
    <Providers queryClient={queryClient}>
      <RouterProvider router={router} />
    </Providers>,
  );
  return { ...utils, router, queryClient };
}
