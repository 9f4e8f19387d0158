import { useLocation } from 'react-router';
import { ButtonLink } from '@/components/Button';
import { EmptyState } from '@/components/EmptyState';

export function NotFoundPage() {
  const location = useLocation();
  return (
    <EmptyState title="No page at this address" action={<ButtonLink to="/">Go to Home</ButtonLink>}>
      <p>
        Wirewalk has nothing at <code className="font-mono break-all">{location.pathname}</code>. The link may be old or
        mistyped; the menu has every page open to you.
      </p>
    </EmptyState>
  );
}
