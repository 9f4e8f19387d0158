import { Fragment, useMemo, useState } from 'react';
import { Link, useParams } from 'react-router';
import { isApiError } from '@/lib/api';
import { cx } from '@/lib/cx';
import { formatBytes, formatDateTime } from '@/lib/format';
import { useMeta } from '@/lib/me';
import { Button } from '@/components/Button';
import { EmptyState } from '@/components/EmptyState';
import { FormError } from '@/components/FormError';
import { PageHeader } from '@/components/PageHeader';
import { Loading } from '@/components/ProgressBar';
import { attachmentUrl, useOutbox, type OutboxMessage } from './api';

/** Turns the URLs in a plain-text mail body into links; everything else stays text. */
function LinkedText({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s<>"]+)/g);
  return (
    <>
      {parts.map((part, i) =>
        i % 2 === 1 ? (
          <a key={i} href={part} target="_blank" rel="noreferrer noopener" className="break-all">
            {part}
          </a>
        ) : (
          <Fragment key={i}>{part}</Fragment>
        ),
      )}
    </>
  );
}

/** The mail's HTML, shown in a sandbox: no scripts, no access to Wirewalk, links open in a new tab. */
function HtmlBody({ html, title }: { html: string; title: string }) {
  const doc = `<!doctype html><html><head><meta charset="utf-8"><base target="_blank"><style>body{font-family:sans-serif;margin:12px;color:#1b1c1e;background:#fff}img{max-width:100%}</style></head><body>${html}</body></html>`;
  return (
    <iframe
      title={`HTML body of “${title}”`}
      sandbox="allow-popups allow-popups-to-escape-sandbox"
      referrerPolicy="no-referrer"
      srcDoc={doc}
      className="h-[32rem] w-full rounded-control border border-line bg-white"
    />
  );
}

function MessageView({ message }: { message: OutboxMessage }) {
  const [view, setView] = useState<'text' | 'html'>(message.html ? 'html' : 'text');
  return (
    <article aria-labelledby="outbox-subject" className="flex flex-col gap-4">
      <header>
        <h2 id="outbox-subject" className="text-xl font-bold">
          {message.subject || '(no subject)'}
        </h2>
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-muted">To</dt>
          <dd className="break-all">{message.to}</dd>
          <dt className="text-ink-muted">From</dt>
          <dd className="break-all">{message.from}</dd>
          <dt className="text-ink-muted">Sent</dt>
          <dd className="tabular">{formatDateTime(message.date)}</dd>
        </dl>
      </header>
      {message.html && message.text ? (
        <div role="group" aria-label="Show the body as" className="flex gap-2">
          <Button tone={view === 'html' ? 'primary' : 'secondary'} aria-pressed={view === 'html'} onClick={() => setView('html')}>
            As formatted
          </Button>
          <Button tone={view === 'text' ? 'primary' : 'secondary'} aria-pressed={view === 'text'} onClick={() => setView('text')}>
            As plain text
          </Button>
        </div>
      ) : null}
      {view === 'html' && message.html ? (
        <HtmlBody html={message.html} title={message.subject} />
      ) : (
        <pre className="overflow-x-auto rounded-control border border-line bg-sunken p-3 font-sans text-base whitespace-pre-wrap">
          <LinkedText text={message.text || '(no plain-text body)'} />
        </pre>
      )}
      {message.attachments.length ? (
        <section>
          <h3 className="mb-2 font-bold">Attachments</h3>
          <ul className="flex flex-col gap-1">
            {message.attachments.map((a) => (
              <li key={a.index}>
                <a href={attachmentUrl(message.id, a.index)} download={a.filename} className="inline-flex min-h-11 items-center gap-2">
                  <span className="break-all">{a.filename}</span>
                  <span className="text-sm text-ink-muted">
                    {a.contentType}, {formatBytes(a.size)}
                  </span>
                </a>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </article>
  );
}

export function Component() {
  const { messageId } = useParams();
  const { meta, isPending: metaPending } = useMeta();
  const outbox = useOutbox(meta?.outbox === true);
  const messages = useMemo(
    () => [...(outbox.data?.messages ?? [])].sort((a, b) => Date.parse(b.date) - Date.parse(a.date)),
    [outbox.data],
  );
  const open = messageId ? messages.find((m) => m.id === messageId) : undefined;

  const lead = 'Every e-mail Wirewalk sent while it runs its own test mail server: invitations, password links, reports.';

  if (metaPending) return <Loading label="Loading the outbox" />;
  if (!meta?.outbox || isApiError(outbox.error, 404)) {
    return (
      <>
        <PageHeader title="Outbox" lead={lead} />
        <EmptyState title="No outbox on this installation">
          Wirewalk sends mail through the shop’s own mail server here, so the messages are in the recipients’ mailboxes, not in
          Wirewalk.
        </EmptyState>
      </>
    );
  }

  return (
    <>
      <PageHeader title="Outbox" lead={lead} />
      {outbox.isPending ? (
        <Loading label="Loading messages" />
      ) : outbox.error ? (
        <FormError error={outbox.error} title="Wirewalk could not load the outbox." />
      ) : messages.length === 0 ? (
        <EmptyState title="No e-mails yet">Invite someone from People, or ask for a password link, and the message shows here.</EmptyState>
      ) : (
        <div className="grid gap-4 lg:grid-cols-[minmax(16rem,24rem)_1fr]">
          <nav aria-label="Messages" className={cx(messageId ? 'hidden lg:block' : '')}>
            <ul className="divide-y divide-line rounded-panel border border-line bg-surface">
              {messages.map((m) => (
                <li key={m.id}>
                  <Link
                    to={`/outbox/${encodeURIComponent(m.id)}`}
                    aria-current={m.id === messageId ? 'true' : undefined}
                    className={cx(
                      'block border-l-4 px-3 py-2 text-ink no-underline hover:bg-sunken',
                      m.id === messageId ? 'border-accent bg-accent-soft' : 'border-transparent',
                    )}
                  >
                    <span className="block font-medium">{m.subject || '(no subject)'}</span>
                    <span className="block text-sm text-ink-muted break-all">To {m.to}</span>
                    <span className="tabular block text-sm text-ink-muted">{formatDateTime(m.date)}</span>
                  </Link>
                </li>
              ))}
            </ul>
          </nav>
          <div className="min-w-0 rounded-panel border border-line bg-surface p-4">
            {messageId ? (
              <>
                <Link to="/outbox" className="mb-3 inline-flex min-h-11 items-center lg:hidden">
                  ← All messages
                </Link>
                {open ? (
                  <MessageView key={open.id} message={open} />
                ) : (
                  <EmptyState title="This message is gone">
                    The test mail server keeps messages only while Wirewalk runs; this one is no longer there.
                  </EmptyState>
                )}
              </>
            ) : (
              <p className="text-ink-muted">Pick a message to read it.</p>
            )}
          </div>
        </div>
      )}
    </>
  );
}
