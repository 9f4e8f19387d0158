import type { ReactNode } from 'react';
import { Navigate, Outlet, useLocation } from 'react-router';
import { roleLabels, type Role } from '@/lib/roles';
import { useMe } from '@/lib/me';
import { signInPath } from '@/lib/paths';
import { Loading } from '@/components/ProgressBar';
import { FormError } from '@/components/FormError';
import { Button, ButtonLink } from '@/components/Button';
import { EmptyState } from '@/components/EmptyState';

/** Renders its children for a signed-in person; anyone else goes to sign-in with a way back. */
export function RequireSignIn({ children }: { children: ReactNode }) {
  const { me, isPending, error, refetch } = useMe();
  const location = useLocation();
  if (isPending) return <Loading label="Checking your sign-in" />;
  if (error && !me) {
    return (
      <main className="mx-auto max-w-md p-4">
        <FormError error={error} title="Wirewalk could not check your sign-in." />
        <Button className="mt-3" onClick={() => void refetch()}>
          Try again
        </Button>
      </main>
    );
  }
  if (!me) return <Navigate to={signInPath(location.pathname + location.search)} replace />;
  return <>{children}</>;
}

/** Shows the nested route only to the listed roles. */
export function RoleGate({ roles }: { roles: readonly Role[] }) {
  const { me } = useMe();
  if (!me) return null;
  if (!roles.includes(me.role)) {
    return (
      <EmptyState title="This page is not open to your role" action={<ButtonLink to="/">Go to Home</ButtonLink>}>
        You are signed in as {roleLabels[me.role].toLowerCase()}. It is for{' '}
        {roles.map((r) => roleLabels[r].toLowerCase()).join(', ')}. Ask the shop owner if you need it.
      </EmptyState>
    );
  }
  return <Outlet />;
}
