import { useParams } from 'react-router';
import { orderStatusLabels } from '@shared/api/orders';
import { Caution, Loading } from '@/components';
import { formatDate } from '@/lib/format';
import { usePublicReport } from '../api';
import { ReadingSetTable } from '../components/ReadingSets';

/** What a customer link opens: the report, read only, no account. */
export function Component() {
  const { token = '' } = useParams();
  const report = usePublicReport(token);
  if (report.error) {
    return (
      <main className="mx-auto max-w-2xl p-6">
        <title>Report link · Wirewalk</title>
        <h1 className="text-2xl font-bold">This report link does not open</h1>
        <p className="mt-2">It is not valid, has expired or was withdrawn. Ask the shop for a new one.</p>
      </main>
    );
  }
  if (!report.data) return <Loading label="Opening the report" />;
  const r = report.data;
  return (
    <main className="mx-auto flex max-w-3xl flex-col gap-5 bg-surface p-6 text-ink">
      <title>{`Repair order ${r.number} · ${r.shopName}`}</title>
      <header>
        <p className="text-lg font-bold">{r.shopName}</p>
        <h1 className="text-3xl font-bold">Repair order {r.number}</h1>
        <p className="text-ink-muted">
          {orderStatusLabels[r.status]} · opened {formatDate(r.openedAt)} · this link is open until {formatDate(r.expiresAt)}
        </p>
        <p className="mt-2">
          <strong>{r.customer.name}</strong>
          {r.customer.company ? `, ${r.customer.company}` : ''}
        </p>
        {r.units.map((u, i) => (
          <p key={i}>{u.modelName ?? 'Unit'} · serial {u.serialNumber}{u.hourMeter !== null ? ` · ${u.hourMeter} h` : ''}</p>
        ))}
        <a className="mt-3 inline-flex min-h-11 items-center font-medium" href={r.pdfUrl}>Download the report (PDF)</a>
      </header>
      <section><h2 className="text-xl font-bold">Complaint</h2><p className="whitespace-pre-line">{r.complaint}</p></section>
      <section><h2 className="text-xl font-bold">Cause</h2><p className="whitespace-pre-line">{r.cause ?? 'Diagnosis is not finished yet.'}</p></section>
      <section><h2 className="text-xl font-bold">Correction</h2><p className="whitespace-pre-line">{r.correction ?? 'No repair recorded yet.'}</p></section>
      {r.customerNotes ? <section><h2 className="text-xl font-bold">Notes from the shop</h2><p className="whitespace-pre-line">{r.customerNotes}</p></section> : null}
      {r.drawings.map((d) => (
        <figure key={d.id}>
          <h2 className="text-xl font-bold">Drawing: {d.title}</h2>
          <img src={d.pngUrl} alt={`${d.title}. ${d.markers.map((m, i) => `${i + 1}. ${m.text}`).join(' ')}`} className="mt-2 w-full border border-line bg-white" />
          <ol className="mt-2 list-decimal pl-6">
            {d.markers.map((m, i) => <li key={i}><strong>{m.kind === 'fault' ? 'Fault' : 'Note'}{m.target ? ` at ${m.target}` : ''}:</strong> {m.text}</li>)}
          </ol>
          {d.notes ? <figcaption>{d.notes}</figcaption> : null}
        </figure>
      ))}
      {r.photos.length ? (
        <section>
          <h2 className="text-xl font-bold">Photos</h2>
          <div className="mt-2 grid gap-3 sm:grid-cols-2">
            {r.photos.map((p) => (
              <figure key={p.id}>
                <img src={p.url} alt={p.caption ?? 'Photo from the job'} className="w-full" />
                {p.caption ? <figcaption className="text-sm text-ink-muted">{p.caption}</figcaption> : null}
              </figure>
            ))}
          </div>
        </section>
      ) : null}
      {r.readingSets.length ? (
        <section><h2 className="text-xl font-bold">Readings</h2>{r.readingSets.map((s) => <ReadingSetTable key={s.id} set={s} />)}</section>
      ) : null}
      <section className="flex flex-col gap-2">
        <h2 className="text-xl font-bold">Safety</h2>
        {r.cautions.map((c) => <Caution key={c.title} caution={c} compact />)}
      </section>
    </main>
  );
}
