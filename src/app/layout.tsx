import { useEffect, useRef, useState } from 'react';
import { Link, NavLink, Outlet, useLocation, useMatches, useNavigate, useNavigation } from 'react-router';
import { roleLabels } from '@/lib/roles';
import { useMe, useMeta, useSignOut } from '@/lib/me';
import { cx } from '@/lib/cx';
import { ModeToggleButton } from '@/components/ModeSwitch';
import { navigationFor } from './navigation';

export function Wordmark({ className }: { className?: string }) {
  return (
    <span className={cx('inline-flex items-center gap-2 text-xl font-bold tracking-tight text-ink', className)}>
      <svg viewBox="0 0 32 32" className="size-7" aria-hidden="true">
        <rect width="32" height="32" rx="6" fill="var(--ww-accent)" />
        <path d="M5 21c4 0 5-10 9-10s4 10 8 10 5-6 5-6" fill="none" stroke="var(--ww-accent-ink)" strokeWidth="3" strokeLinecap="round" />
        <circle cx="5" cy="21" r="2.5" fill="var(--ww-accent-ink)" />
        <circle cx="27" cy="15" r="2.5" fill="var(--ww-accent-ink)" />
      </svg>
      Wirewalk
    </span>
  );
}

/** A thin bar at the very top while a lazily loaded page is on its way. */
function NavigationProgress() {
  const navigation = useNavigation();
  if (navigation.state === 'idle') return null;
  return (
    <div className="fixed inset-x-0 top-0 z-50">
      <div role="progressbar" aria-label="Opening the page" className="relative h-1 overflow-hidden bg-sunken">
        <div className="ww-indeterminate absolute inset-y-0 w-1/3 bg-accent" />
      </div>
    </div>
  );
}

function NavLinks({ onPick, className }: { onPick?: () => void; className?: string }) {
  const { me } = useMe();
  const { meta } = useMeta();
  const entries = navigationFor(me?.role ?? null, meta);
  return (
    <ul className={className}>
      {entries.map((entry) => (
        <li key={entry.to}>
          <NavLink
            to={entry.to}
            end={entry.end}
            onClick={onPick}
            className={({ isActive }) =>
              cx(
                'flex min-h-11 items-center rounded-control border-l-4 px-3 text-base no-underline',
                isActive ? 'border-accent bg-accent-soft font-bold text-ink' : 'border-transparent text-ink hover:bg-sunken',
              )
            }
          >
            {entry.label}
          </NavLink>
        </li>
      ))}
    </ul>
  );
}

function SignOutButton({ className }: { className?: string }) {
  const signOut = useSignOut();
  const navigate = useNavigate();
  return (
    <button
      type="button"
      className={cx('touch rounded-control px-3 text-ink underline-offset-4 hover:bg-sunken hover:underline', className)}
      disabled={signOut.isPending}
      onClick={() => signOut.mutate(undefined, { onSettled: () => navigate('/sign-in', { replace: true }) })}
    >
      {signOut.isPending ? 'Signing out…' : 'Sign out'}
    </button>
  );
}

/** The signed-in frame: header with shop and person, navigation by role (a menu on phones), the page. */
export function AppLayout() {
  const { me } = useMe();
  const [menuOpen, setMenuOpen] = useState(false);
  const location = useLocation();
  // A page whose route module exports `handle = { fill: true }` (the drawing) takes all the room below
  // the header and banner, so the page itself never scrolls under it.
  const fill = useMatches().some((m) => (m.handle as { fill?: boolean } | undefined)?.fill);

  // Close the phone menu whenever the page changes.
  const [lastPath, setLastPath] = useState(location.pathname);
  if (lastPath !== location.pathname) {
    setLastPath(location.pathname);
    setMenuOpen(false);
  }

  // After moving to another page, put keyboard and screen-reader focus at the top of the new page.
  const mainRef = useRef<HTMLElement>(null);
  const firstPath = useRef(true);
  useEffect(() => {
    if (firstPath.current) {
      firstPath.current = false;
      return;
    }
    mainRef.current?.focus({ preventScroll: true });
  }, [location.pathname]);

  useEffect(() => {
    if (!menuOpen) return;
    const onKey = (e: KeyboardEvent) => e.key === 'Escape' && setMenuOpen(false);
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [menuOpen]);

  if (!me) return null;

  return (
    <div className={cx('flex flex-col', fill ? 'h-dvh' : 'min-h-dvh')}>
      <NavigationProgress />
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:bg-surface focus:p-2">
        Skip to the page
      </a>
      {me.demo ? (
        <p className="no-print bg-ink px-4 py-1 text-center text-sm text-ground">
          <span className="sm:hidden">Demo shop: invented data, public sign-ins.</span>
          <span className="hidden sm:inline">
            Demo shop: everything here is invented, and the demo sign-ins are public. Do not keep real customer data here.
          </span>
        </p>
      ) : null}
      <header className="no-print sticky top-0 z-30 border-b border-line bg-surface">
        <div className="mx-auto flex h-14 max-w-[96rem] items-center gap-2 px-2 sm:px-4">
          <Link to="/" className="mr-auto rounded-control px-1 no-underline" aria-label="Wirewalk, Home">
            <Wordmark />
          </Link>
          <p className="hidden text-right leading-tight md:block">
            <span className="block font-medium">{me.user.name}</span>
            <span className="block text-sm text-ink-muted">
              {roleLabels[me.role]} · {me.shop.name}
            </span>
          </p>
          <ModeToggleButton />
          <SignOutButton className="hidden md:inline-flex md:items-center" />
          <button
            type="button"
            className="touch inline-flex items-center gap-2 rounded-control border border-field px-3 md:hidden"
            aria-expanded={menuOpen}
            aria-controls="ww-phone-menu"
            onClick={() => setMenuOpen((open) => !open)}
          >
            <svg viewBox="0 0 24 24" className="size-5" aria-hidden="true">
              {menuOpen ? (
                <path d="M6 6l12 12M18 6 6 18" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
              ) : (
                <path d="M4 7h16M4 12h16M4 17h16" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
              )}
            </svg>
            Menu
          </button>
        </div>
        {menuOpen ? (
          <nav id="ww-phone-menu" aria-label="Main" className="border-t border-line px-2 pb-3 md:hidden">
            <p className="px-3 py-2 text-sm text-ink-muted">
              {me.user.name} · {roleLabels[me.role]} · {me.shop.name}
            </p>
            <NavLinks onPick={() => setMenuOpen(false)} className="flex flex-col gap-1" />
            <SignOutButton className="mt-2 w-full text-left" />
          </nav>
        ) : null}
      </header>
      <div className={cx('mx-auto flex w-full max-w-[96rem] flex-1', fill && 'min-h-0')}>
        <nav aria-label="Main" className="no-print hidden w-56 shrink-0 border-r border-line p-3 md:block">
          <NavLinks className="sticky top-17 flex flex-col gap-1" />
        </nav>
        <main id="main" ref={mainRef} tabIndex={-1} className={cx('min-w-0 flex-1 outline-none', fill ? 'flex min-h-0 flex-col' : 'px-3 py-5 sm:px-6')}>
          <Outlet />
        </main>
      </div>
    </div>
  );
}

/** The frame for sign-in, password reset and invitations: the wordmark, one card, the mode switch. */
export function PublicLayout() {
  return (
    <div className="flex min-h-dvh flex-col items-center px-3 py-6 sm:py-12">
      <NavigationProgress />
      <header className="mb-6 flex w-full max-w-md items-center justify-between">
        <Wordmark />
        <ModeToggleButton />
      </header>
      <main id="main" className="w-full max-w-md rounded-panel border border-line bg-surface p-5 sm:p-6">
        <Outlet />
      </main>
      <p className="mt-6 max-w-md text-center text-sm text-ink-muted">
        The shop’s harness reference: pin cards, circuit walks, readings and fault suspects.
      </p>
    </div>
  );
}
