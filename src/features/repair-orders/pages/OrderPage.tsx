import { useRef, useState } from 'react';
import { Link, useParams } from 'react-router';
import { orderStatuses, orderStatusLabels, timeKindLabels, timeKinds, type OrderDetail, type OrderStatus, type OrderUpdate, type TimeKind } from '@shared/api/orders';
import { Button, Caution, EmptyState, FormError, Loading, PageHeader, Panel, useToast } from '@/components';
import { ApiError, errorMessage } from '@/lib/api';
import { formatBytes, formatDate, formatDateTime } from '@/lib/format';
import { useMe } from '@/lib/me';
import {
  useAddTime,
  useAttachProcedure,
  useAttachmentChange,
  useCreateLink,
  useOrder,
  usePeople,
  useProcedures,
  useRemoveDrawing,
  useRemoveTime,
  useRevokeLink,
  useSendReport,
  useTickStep,
  useUpdateOrder,
  useUpload,
} from '../api';
import { DrawingForm } from '../components/DrawingForm';
import { ReadingSets } from '../components/ReadingSets';
import { StalledTag, StatusTag, hours } from '../components/StatusTag';

const inputClass = 'block min-h-11 w-full rounded-control border border-field bg-surface px-3 py-2 text-base text-ink disabled:opacity-70';

export function Component() {
  const { orderId = '' } = useParams();
  const order = useOrder(orderId);
  if (order.error) {
    return (
      <main>
        <FormError error={order.error} title="This repair order could not be opened." />
        <Link to="/repair-orders">Back to the repair orders</Link>
      </main>
    );
  }
  if (!order.data) return <Loading label="Opening the repair order" />;
  return <OrderView order={order.data} />;
}

function OrderView({ order }: { order: OrderDetail }) {
  const { me } = useMe();
  const seesStalled = me?.role === 'lead' || me?.role === 'owner';
  return (
    <main className="flex flex-col gap-4">
      <PageHeader
        title={`Repair order ${order.number}`}
        lead={`${order.customer.name} · ${order.units.map((u) => `${u.modelName ?? 'Unit'} ${u.serialNumber}`).join(' + ')} · opened ${formatDate(order.openedAt)}${order.openedBy ? ` by ${order.openedBy.name}` : ''}`}
        actions={
          <>
            <StatusTag status={order.status} />
            {order.stalled && seesStalled ? <StalledTag minutes={order.diagnosisMinutes} /> : null}
            <a className="inline-flex min-h-11 items-center rounded-control border border-field bg-surface px-4 font-medium text-ink no-underline hover:bg-sunken" href={`/api/repair-orders/${order.id}/report.pdf`} target="_blank" rel="noreferrer">
              Preview the report (PDF)
            </a>
          </>
        }
      />
      <div className="grid gap-4 lg:grid-cols-[2fr_1fr]">
        <div className="flex flex-col gap-4">
          <FindingsPanel key={order.version} order={order} />
          <DrawingsPanel order={order} />
          <PhotosPanel order={order} />
          <Panel title="Readings" description="Reading sets taken on this job, with their marks and the suspects at the time.">
            <ReadingSets orderId={order.id} />
          </Panel>
          <ProceduresPanel order={order} />
        </div>
        <div className="flex flex-col gap-4">
          <CustomerPanel order={order} />
          <TimePanel order={order} />
          <ReportPanel order={order} />
        </div>
      </div>
    </main>
  );
}

function CustomerPanel({ order }: { order: OrderDetail }) {
  const c = order.customer;
  return (
    <Panel title="Customer and unit">
      <p className="font-bold">{c.name}</p>
      {c.company ? <p>{c.company}</p> : null}
      <p>{[c.email, c.phone].filter(Boolean).join(' · ')}</p>
      {c.contacts.map((p, i) => (
        <p key={i} className="text-sm text-ink-muted">{p.name}{p.role ? `, ${p.role}` : ''}{p.phone ? ` · ${p.phone}` : ''}</p>
      ))}
      <ul className="mt-2 flex flex-col gap-1">
        {order.units.map((u) => (
          <li key={u.id}>
            <strong>{u.modelName ?? 'Unit'}</strong> · serial {u.serialNumber}
            {u.hourMeter !== null ? ` · ${u.hourMeter} h` : ''}
          </li>
        ))}
      </ul>
    </Panel>
  );
}

function FindingsPanel({ order }: { order: OrderDetail }) {
  const update = useUpdateOrder(order.id);
  const people = usePeople();
  const { notify } = useToast();
  const [v, setV] = useState({
    status: order.status,
    assignedTechId: order.assignedTech?.id ?? '',
    complaint: order.complaint,
    cause: order.cause ?? '',
    correction: order.correction ?? '',
    labourNotes: order.labourNotes ?? '',
    internalNotes: order.internalNotes ?? '',
    customerNotes: order.customerNotes ?? '',
  });
  const desk = order.can.edit;
  const findings = order.can.editFindings;
  const set = (k: keyof typeof v) => (e: { target: { value: string } }) => setV((s) => ({ ...s, [k]: e.target.value }));
  const save = () => {
    const body: OrderUpdate = { version: order.version };
    if (v.status !== order.status) body.status = v.status as OrderStatus;
    if (findings) {
      if (v.cause !== (order.cause ?? '')) body.cause = v.cause || null;
      if (v.correction !== (order.correction ?? '')) body.correction = v.correction || null;
      if (v.labourNotes !== (order.labourNotes ?? '')) body.labourNotes = v.labourNotes || null;
      if (v.internalNotes !== (order.internalNotes ?? '')) body.internalNotes = v.internalNotes || null;
    }
    if (desk) {
      if (v.complaint !== order.complaint) body.complaint = v.complaint;
      if (v.customerNotes !== (order.customerNotes ?? '')) body.customerNotes = v.customerNotes || null;
      if (v.assignedTechId !== (order.assignedTech?.id ?? '')) body.assignedTechId = v.assignedTechId || null;
    }
    update.mutate(body, { onSuccess: () => notify(`Order ${order.number} saved.`) });
  };
  const stale = update.error instanceof ApiError && update.error.status === 409;
  const statusChoices = me_isTechOnly(order) ? orderStatuses.filter((s) => s !== 'closed' || order.status === 'closed') : orderStatuses;
  return (
    <Panel title="Complaint, cause, correction" description={findings || desk ? 'Internal notes stay in the shop; the note for the customer goes into the report.' : 'Read only: this order is not assigned to you.'}>
      <div className="flex flex-col gap-3">
        <div className="grid gap-3 sm:grid-cols-2">
          <label className="flex flex-col gap-1"><span className="font-medium">Status</span>
            <select className={inputClass} value={v.status} onChange={set('status')} disabled={!findings && !desk}>
              {statusChoices.map((s) => <option key={s} value={s}>{orderStatusLabels[s]}</option>)}
            </select>
          </label>
          <label className="flex flex-col gap-1"><span className="font-medium">Technician</span>
            <select className={inputClass} value={v.assignedTechId} onChange={set('assignedTechId')} disabled={!desk}>
              <option value="">Not assigned</option>
              {(people.data ?? []).map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
              {order.assignedTech && !people.data?.some((p) => p.id === order.assignedTech!.id) ? <option value={order.assignedTech.id}>{order.assignedTech.name}</option> : null}
            </select>
          </label>
        </div>
        <label className="flex flex-col gap-1"><span className="font-medium">Complaint</span><textarea className={inputClass} rows={2} value={v.complaint} onChange={set('complaint')} disabled={!desk} /></label>
        <label className="flex flex-col gap-1"><span className="font-medium">Cause</span><textarea className={inputClass} rows={3} value={v.cause} onChange={set('cause')} disabled={!findings && !desk} placeholder="What was wrong, and where." /></label>
        <label className="flex flex-col gap-1"><span className="font-medium">Correction</span><textarea className={inputClass} rows={3} value={v.correction} onChange={set('correction')} disabled={!findings && !desk} placeholder="What was done to fix it." /></label>
        <label className="flex flex-col gap-1"><span className="font-medium">Labour notes</span><textarea className={inputClass} rows={2} value={v.labourNotes} onChange={set('labourNotes')} disabled={!findings && !desk} /></label>
        <div className="grid gap-3 sm:grid-cols-2">
          <label className="flex flex-col gap-1"><span className="font-medium">Internal notes (shop only)</span><textarea className={inputClass} rows={3} value={v.internalNotes} onChange={set('internalNotes')} disabled={!findings && !desk} /></label>
          <label className="flex flex-col gap-1"><span className="font-medium">Note for the customer (in the report)</span><textarea className={inputClass} rows={3} value={v.customerNotes} onChange={set('customerNotes')} disabled={!desk} /></label>
        </div>
        {update.error ? (
          <FormError error={stale ? new Error(`${errorMessage(update.error)} The page now shows the saved order; your text is still in the boxes only if you have not reloaded.`) : update.error} title="The order was not saved." />
        ) : null}
        {findings || desk ? (
          <div><Button tone="primary" busy={update.isPending} onClick={save}>Save the order</Button></div>
        ) : null}
      </div>
    </Panel>
  );
}

function me_isTechOnly(order: OrderDetail) {
  return !order.can.edit && order.can.editFindings;
}

function TimePanel({ order }: { order: OrderDetail }) {
  const add = useAddTime(order.id);
  const remove = useRemoveTime(order.id);
  const [kind, setKind] = useState<TimeKind>('diagnosis');
  const [minutes, setMinutes] = useState('');
  const [note, setNote] = useState('');
  return (
    <Panel title="Time" description={`Diagnosis ${hours(order.diagnosisMinutes)} · total ${hours(order.totalMinutes)}`}>
      {order.timeEntries.length ? (
        <ul className="mb-3 flex flex-col divide-y divide-line">
          {order.timeEntries.map((e) => (
            <li key={e.id} className="flex items-start justify-between gap-2 py-2">
              <span>
                <strong className="tabular-nums">{e.minutes} min</strong> {timeKindLabels[e.kind].toLowerCase()} · {e.tech.name} · {formatDate(e.workDate)}
                {e.note ? <span className="block text-sm text-ink-muted">{e.note}</span> : null}
              </span>
              {order.can.editFindings ? <Button tone="quiet" aria-label={`Remove ${e.minutes} min of ${e.tech.name}`} onClick={() => remove.mutate(e.id)}>Remove</Button> : null}
            </li>
          ))}
        </ul>
      ) : (
        <p className="mb-3 text-ink-muted">No time logged yet.</p>
      )}
      {order.can.editFindings ? (
        <form
          className="grid gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            add.mutate({ kind, minutes: Number(minutes), note: note || null }, { onSuccess: () => { setMinutes(''); setNote(''); } });
          }}
        >
          <div className="grid grid-cols-2 gap-2">
            <label className="flex flex-col gap-1">Kind
              <select className={inputClass} value={kind} onChange={(e) => setKind(e.target.value as TimeKind)}>
                {timeKinds.map((k) => <option key={k} value={k}>{timeKindLabels[k]}</option>)}
              </select>
            </label>
            <label className="flex flex-col gap-1">Minutes<input className={inputClass} inputMode="numeric" value={minutes} onChange={(e) => setMinutes(e.target.value)} /></label>
          </div>
          <label className="flex flex-col gap-1">What you did<input className={inputClass} value={note} onChange={(e) => setNote(e.target.value)} /></label>
          {add.error ? <FormError error={add.error} title="The time was not logged." /> : null}
          <div><Button type="submit" busy={add.isPending}>Log time</Button></div>
        </form>
      ) : null}
    </Panel>
  );
}

function ProceduresPanel({ order }: { order: OrderDetail }) {
  const procedures = useProcedures();
  const attach = useAttachProcedure(order.id);
  const tick = useTickStep(order.id);
  const [pick, setPick] = useState('');
  const canAttach = order.can.edit || order.can.editFindings;
  return (
    <Panel title="Procedures" description="Checklists for steps this job needs; each tick records who and when.">
      {order.procedures.length === 0 ? <p className="text-ink-muted">No procedure on this order.</p> : null}
      {order.procedures.map((p) => (
        <section key={p.id} className="mb-4">
          <h3 className="font-bold">{p.title}</h3>
          {p.notes ? <Caution caution={{ title: 'Follow the manufacturer’s procedure', text: p.notes }} compact className="my-2" /> : null}
          <ol className="flex flex-col gap-1">
            {p.steps.map((s, i) => (
              <li key={s.id}>
                <label className="flex min-h-11 items-start gap-3 py-1">
                  <input
                    type="checkbox"
                    className="mt-1 size-6 shrink-0"
                    checked={!!s.doneAt}
                    disabled={!order.can.editFindings || tick.isPending}
                    onChange={(e) => tick.mutate({ opId: p.id, stepId: s.id, done: e.target.checked })}
                  />
                  <span>
                    {i + 1}. {s.text}
                    {s.doneAt ? <span className="block text-sm text-ok">✓ Done by {s.doneBy?.name ?? 'someone'}, {formatDateTime(s.doneAt)}</span> : null}
                  </span>
                </label>
              </li>
            ))}
          </ol>
        </section>
      ))}
      {tick.error ? <FormError error={tick.error} title="The step was not ticked." /> : null}
      {canAttach ? (
        <div className="flex flex-wrap items-end gap-2">
          <label className="flex flex-col gap-1">Attach a procedure
            <select className={inputClass} value={pick} onChange={(e) => setPick(e.target.value)}>
              <option value="">Pick one</option>
              {procedures.data?.map((p) => <option key={p.id} value={p.id}>{p.title}</option>)}
            </select>
          </label>
          <Button disabled={!pick} busy={attach.isPending} onClick={() => attach.mutate(pick, { onSuccess: () => setPick('') })}>Attach</Button>
          {attach.error ? <FormError error={attach.error} title="The procedure was not attached." /> : null}
        </div>
      ) : null}
    </Panel>
  );
}

function DrawingsPanel({ order }: { order: OrderDetail }) {
  const [adding, setAdding] = useState(false);
  const remove = useRemoveDrawing(order.id);
  return (
    <Panel
      title="Marked-up drawings"
      description="Frozen views of a harness revision: the walked path, fault markers and notes."
      actions={order.can.editFindings && !adding ? <Button onClick={() => setAdding(true)}>Attach a drawing</Button> : null}
    >
      {adding ? <DrawingForm orderId={order.id} onDone={() => setAdding(false)} /> : null}
      {order.drawings.length === 0 && !adding ? <p className="text-ink-muted">No drawing attached yet.</p> : null}
      <div className="flex flex-col gap-4">
        {order.drawings.map((d) => (
          <figure key={d.id} className="rounded-control border border-line p-2">
            <img src={d.svgUrl} alt={`Drawing: ${d.title}. ${d.markers.map((m, i) => `${i + 1}. ${m.kind} ${m.target ?? ''}: ${m.text}`).join(' ')}`} className="w-full bg-white" />
            <figcaption className="mt-2">
              <strong>{d.title}</strong> · {d.harnessName}{d.revisionNumber !== null ? `, revision ${d.revisionNumber}` : ''} · {d.createdBy?.name ?? ''} {formatDateTime(d.createdAt)}
              {d.notes ? <p>{d.notes}</p> : null}
              <span className="mt-1 flex flex-wrap gap-3 text-sm">
                <a href={d.pngUrl} target="_blank" rel="noreferrer">PNG</a>
                <a href={d.svgUrl} target="_blank" rel="noreferrer">SVG</a>
                {order.can.editFindings ? <button type="button" className="underline" onClick={() => remove.mutate(d.id)}>Remove</button> : null}
              </span>
            </figcaption>
          </figure>
        ))}
      </div>
    </Panel>
  );
}

function PhotosPanel({ order }: { order: OrderDetail }) {
  const upload = useUpload(order.id);
  const change = useAttachmentChange(order.id);
  const input = useRef<HTMLInputElement>(null);
  const [files, setFiles] = useState<File[]>([]);
  const can = order.can.editFindings;
  return (
    <Panel title="Photos and files" description="Up to 10 at once, 15 MB each: photos (JPEG, PNG, WebP) and PDF files. Ticked photos go into the report.">
      {can ? (
        <form
          className="mb-3 flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            upload.mutate(files, { onSuccess: () => { setFiles([]); if (input.current) input.current.value = ''; } });
          }}
        >
          <label className="flex flex-col gap-1">
            <span className="font-medium">Choose photos or files</span>
            <input ref={input} type="file" multiple accept="image/jpeg,image/png,image/webp,application/pdf" className="min-h-11" onChange={(e) => setFiles([...(e.target.files ?? [])])} />
          </label>
          <Button type="submit" disabled={!files.length} busy={upload.isPending}>Upload {files.length ? `${files.length} file${files.length > 1 ? 's' : ''}` : ''}</Button>
        </form>
      ) : null}
      {upload.error ? <FormError error={upload.error} title="Nothing was uploaded." /> : null}
      {order.attachments.length === 0 ? <p className="text-ink-muted">No photos or files yet.</p> : null}
      <ul className="grid gap-3 sm:grid-cols-3">
        {order.attachments.map((a) => (
          <li key={a.id} className="rounded-control border border-line p-2">
            <a href={a.url} target="_blank" rel="noreferrer">
              {a.thumbUrl ? <img src={a.thumbUrl} alt={a.caption ?? a.filename} className="aspect-[4/3] w-full object-cover" /> : <span className="block py-6 text-center">📄 {a.filename}</span>}
            </a>
            <p className="truncate text-sm" title={a.filename}>{a.filename} · {formatBytes(a.size)}</p>
            {a.kind === 'photo' && (can || order.can.edit) ? (
              <>
                <label className="flex min-h-11 items-center gap-2">
                  <input type="checkbox" className="size-5" checked={a.inReport} onChange={(e) => change.mutate({ id: a.id, inReport: e.target.checked })} />
                  In the report
                </label>
                <CaptionField key={a.caption ?? ''} initial={a.caption ?? ''} onSave={(caption) => change.mutate({ id: a.id, caption: caption || null })} />
              </>
            ) : a.caption ? <p className="text-sm">{a.caption}</p> : null}
          </li>
        ))}
      </ul>
    </Panel>
  );
}

function CaptionField({ initial, onSave }: { initial: string; onSave: (v: string) => void }) {
  // Re-keyed by the caller when the saved caption changes.
  const [v, setV] = useState(initial);
  return (
    <input
      className={inputClass}
      aria-label="Caption"
      placeholder="Caption"
      value={v}
      onChange={(e) => setV(e.target.value)}
      onBlur={() => v !== initial && onSave(v)}
    />
  );
}

function ReportPanel({ order }: { order: OrderDetail }) {
  const send = useSendReport(order.id);
  const makeLink = useCreateLink(order.id);
  const revoke = useRevokeLink(order.id);
  const [to, setTo] = useState(order.customer.email ?? '');
  const [message, setMessage] = useState('');
  const [newLink, setNewLink] = useState<string | null>(null);
  const { notify } = useToast();
  return (
    <Panel title="Report to the customer" description="The three Cs, the drawings, the ticked photos, the readings and the cautions, as a PDF.">
      <a className="mb-3 inline-flex min-h-11 items-center font-medium" href={`/api/repair-orders/${order.id}/report.pdf`} target="_blank" rel="noreferrer">Preview the PDF</a>
      {order.can.send ? (
        <form
          className="flex flex-col gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            send.mutate(
              { to: to || undefined, message: message || null, includeLink: true },
              {
                onSuccess: (r) => {
                  setNewLink(r.link?.url ?? null);
                  notify(`Report sent to ${r.sent.to}.`);
                },
              },
            );
          }}
        >
          <label className="flex flex-col gap-1">Send to<input className={inputClass} type="email" value={to} onChange={(e) => setTo(e.target.value)} /></label>
          <label className="flex flex-col gap-1">Message<textarea className={inputClass} rows={3} value={message} onChange={(e) => setMessage(e.target.value)} placeholder="Your machine is ready for pick-up." /></label>
          {send.error ? <FormError error={send.error} title="The report was not sent." /> : null}
          <div><Button type="submit" tone="primary" busy={send.isPending}>E-mail the report</Button></div>
        </form>
      ) : null}
      {newLink ? (
        <p className="mt-2 break-all rounded-control bg-accent-soft p-2" role="status">
          Customer link: <a href={newLink}>{newLink}</a>
        </p>
      ) : null}
      <h3 className="mt-4 font-bold">Sent</h3>
      {order.sends.length === 0 ? <p className="text-ink-muted">Not sent yet.</p> : null}
      <ul className="flex flex-col gap-1">
        {order.sends.map((s) => (
          <li key={s.id} className="text-sm">
            {formatDateTime(s.sentAt)} · {s.sentBy?.name ?? 'someone'} → {s.to} · {s.filename} ({formatBytes(s.bytes)})
          </li>
        ))}
      </ul>
      <h3 className="mt-4 font-bold">Customer links</h3>
      <ul className="flex flex-col gap-1">
        {order.links.map((l) => (
          <li key={l.id} className="flex flex-wrap items-center gap-2 text-sm">
            <span>
              Made {formatDate(l.createdAt)} by {l.createdBy?.name ?? 'someone'} ·{' '}
              {l.revokedAt ? `withdrawn ${formatDate(l.revokedAt)}` : new Date(l.expiresAt) < new Date() ? `expired ${formatDate(l.expiresAt)}` : `open until ${formatDate(l.expiresAt)}`}
              {l.lastOpenedAt ? ` · last opened ${formatDateTime(l.lastOpenedAt)}` : ''}
            </span>
            {order.can.send && !l.revokedAt ? <Button tone="quiet" onClick={() => revoke.mutate(l.id)}>Withdraw</Button> : null}
          </li>
        ))}
      </ul>
      {order.can.send ? (
        <Button className="mt-2" busy={makeLink.isPending} onClick={() => makeLink.mutate(undefined, { onSuccess: (r) => setNewLink(r.link.url) })}>
          Make a customer link
        </Button>
      ) : null}
    </Panel>
  );
}

export function NoOrder() {
  return <EmptyState title="No order">Pick one from the list.</EmptyState>;
}
