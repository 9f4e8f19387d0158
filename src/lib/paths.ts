/** The sign-in address that brings the person back to `path` afterwards. */
export function signInPath(path: string): string {
  return path && path !== '/' ? `/sign-in?next=${encodeURIComponent(path)}` : '/sign-in';
}

/** A path from `?next=` that is safe to go to: same site, absolute path, not back to sign-in. */
export function safeNext(next: string | null): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\') || next.startsWith('/sign-in')) return '/';
  return next;
}
