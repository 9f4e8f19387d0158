import { isRouteErrorResponse, useRouteError } from 'react-router';
import { ApiError } from '@/lib/api';
import { Button, ButtonLink } from '@/components/Button';
import { NotFoundPage } from './NotFoundPage';

function isChunkLoadError(error: unknown) {
  return (
    error instanceof Error &&
    /Failed to fetch dynamically imported module|error loading dynamically imported module|Importing a module script failed/i.test(error.message)
  );
}

/** The error boundary of every route: says what happened and what to do next; never a stack trace. */
export function RouteError() {
  const error = useRouteError();
  if ((isRouteErrorResponse(error) && error.status === 404) || (error instanceof ApiError && error.status === 404)) {
    return <NotFoundPage />;
  }
  let title = 'This page ran into a problem';
  let text = 'Reload the page. If it happens again, tell the shop owner what you were doing when it did.';
  if (isChunkLoadError(error)) {
    title = 'Wirewalk was updated';
    text = 'A newer version is on the server. Reload the page to get it.';
  } else if (error instanceof ApiError && error.status === 0) {
    title = 'No connection to the server';
    text = error.message;
  } else if (error instanceof ApiError && error.status === 403) {
    title = 'Not open to your role';
    text = error.message;
  }
  if (import.meta.env.DEV) console.error(error);
  return (
    <div role="alert" className="mx-auto max-w-prose rounded-panel border-2 border-bad bg-surface p-5">
      <h1 className="text-xl font-bold text-bad">
        <span aria-hidden="true">✗ </span>
        {title}
      </h1>
      <p className="mt-2">{text}</p>
      <div className="mt-4 flex flex-wrap gap-2">
        <Button tone="primary" onClick={() => window.location.reload()}>
          Reload the page
        </Button>
        <ButtonLink to="/">Go to Home</ButtonLink>
      </div>
    </div>
  );
}
