import type { ReactNode } from 'react';

/**
 * The top of a page: its h1, a line of what it is for, and its main actions.
 * Also sets the browser tab's title ("People · Wirewalk"); pass `documentTitle` when `title` is not plain text.
 */
export function PageHeader({
  title,
  lead,
  actions,
  documentTitle,
}: {
  title: ReactNode;
  lead?: ReactNode;
  actions?: ReactNode;
  documentTitle?: string;
}) {
  const tab = documentTitle ?? (typeof title === 'string' ? title : null);
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-3">
      {tab ? <title>{`${tab} · Wirewalk`}</title> : null}
      <div className="min-w-0">
        <h1 className="text-2xl font-bold sm:text-3xl">{title}</h1>
        {lead ? <p className="mt-1 max-w-prose text-ink-muted">{lead}</p> : null}
      </div>
      {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
    </header>
  );
}
