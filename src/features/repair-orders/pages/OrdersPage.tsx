import { useState } from 'react';
import { Link, useSearchParams } from 'react-router';
import { orderStatuses, orderStatusLabels, type OrderListQuery, type OrderStatus } from '@shared/api/orders';
import { Button, ButtonLink, EmptyState, FormError, Loading, PageHeader } from '@/components';
import { useMe } from '@/lib/me';
import { formatDate } from '@/lib/format';
import { useCustomers, useOrders, usePeople } from '../api';
import { StalledTag, StatusTag, hours } from '../components/StatusTag';

const sorts = [
  { value: 'number', label: 'Number' },
  { value: 'openedAt', label: 'Opened' },
  { value: 'updatedAt', label: 'Last change' },
  { value: 'status', label: 'Status' },
  { value: 'customer', label: 'Customer' },
] as const;

const inputClass = 'block min-h-11 w-full rounded-control border border-field bg-surface px-3 py-2 text-base text-ink';

/** Repair orders: the desk's and lead's list, or the tech's own ("My orders" opens it with techId=me). */
export function Component() {
  const { me } = useMe();
  const [params, setParams] = useSearchParams();
  const isTech = me?.role === 'tech';
  const q: OrderListQuery = {
    status: params.getAll('status') as OrderStatus[],
    techId: params.get('techId') === 'all' ? undefined : (params.get('techId') ?? (isTech ? 'me' : undefined)),
    customerId: params.get('customerId') ?? undefined,
    from: params.get('from') ?? undefined,
    to: params.get('to') ?? undefined,
    stalled: params.get('stalled') === '1' ? '1' : undefined,
    q: params.get('q') ?? undefined,
    sort: (params.get('sort') as OrderListQuery['sort']) ?? 'number',
    dir: (params.get('dir') as 'asc' | 'desc') ?? 'desc',
    page: Number(params.get('page') ?? 1),
    pageSize: 25,
  };
  const orders = useOrders(q);
  const people = usePeople();
  const customers = useCustomers('', 1);
  const [search, setSearch] = useState(q.q ?? '');
  const set = (key: string, value: string | string[] | null) => {
    const next = new URLSearchParams(params);
    next.delete(key);
    if (Array.isArray(value)) value.forEach((v) => next.append(key, v));
    else if (value) next.set(key, value);
    if (key !== 'page') next.delete('page');
    setParams(next, { replace: true });
  };
  const desk = me?.role === 'writer' || me?.role === 'lead' || me?.role === 'owner';
  const seesStalled = me?.role === 'lead' || me?.role === 'owner';
  const page = Number(params.get('page') ?? 1);
  const data = orders.data;
  const pages = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;
  const stalledHere = data?.orders.filter((o) => o.stalled).length ?? 0;

  return (
    <main>
      <PageHeader
        title={isTech && q.techId === 'me' ? 'My orders' : 'Repair orders'}
        lead="Every job from complaint to the customer’s report. Filter, sort and open an order."
        actions={desk ? <ButtonLink tone="primary" to="/repair-orders/new">New repair order</ButtonLink> : null}
      />
      <form
        className="mb-4 grid gap-3 rounded-panel border border-line bg-surface p-4 sm:grid-cols-2 lg:grid-cols-4"
        onSubmit={(e) => {
          e.preventDefault();
          set('q', search.trim() || null);
        }}
        aria-label="Filter repair orders"
      >
        <label className="flex flex-col gap-1">
          <span className="font-medium">Search</span>
          <input className={inputClass} value={search} onChange={(e) => setSearch(e.target.value)} placeholder="Number, customer, serial, complaint" />
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-medium">Status</span>
          <select className={inputClass} value={q.status?.[0] ?? ''} onChange={(e) => set('status', e.target.value ? [e.target.value] : null)}>
            <option value="">Any status</option>
            {orderStatuses.map((s) => (
              <option key={s} value={s}>
                {orderStatusLabels[s]}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-medium">Technician</span>
          <select className={inputClass} value={q.techId ?? ''} onChange={(e) => set('techId', e.target.value || (isTech ? 'all' : null))}>
            <option value="">{isTech ? 'Everyone' : 'Any technician'}</option>
            <option value="me">Me</option>
            <option value="none">Not assigned</option>
            {people.data?.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-medium">Customer</span>
          <select className={inputClass} value={q.customerId ?? ''} onChange={(e) => set('customerId', e.target.value || null)}>
            <option value="">Any customer</option>
            {customers.data?.customers.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-medium">Opened from</span>
          <input type="date" className={inputClass} value={q.from ?? ''} onChange={(e) => set('from', e.target.value || null)} />
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-medium">Opened to</span>
          <input type="date" className={inputClass} value={q.to ?? ''} onChange={(e) => set('to', e.target.value || null)} />
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-medium">Sort by</span>
          <span className="flex gap-2">
            <select className={inputClass} value={q.sort} onChange={(e) => set('sort', e.target.value)}>
              {sorts.map((s) => (
                <option key={s.value} value={s.value}>
                  {s.label}
                </option>
              ))}
            </select>
            <Button onClick={() => set('dir', q.dir === 'asc' ? 'desc' : 'asc')} aria-label={q.dir === 'asc' ? 'Ascending; switch to descending' : 'Descending; switch to ascending'}>
              {q.dir === 'asc' ? '↑' : '↓'}
            </Button>
          </span>
        </label>
        <div className="flex items-end gap-2">
          <label className="flex min-h-11 items-center gap-2">
            <input type="checkbox" className="size-5" checked={q.stalled === '1'} onChange={(e) => set('stalled', e.target.checked ? '1' : null)} />
            Stalled only
          </label>
          <Button type="submit">Search</Button>
        </div>
      </form>

      {orders.error ? <FormError error={orders.error} title="The orders could not be loaded." /> : null}
      {!data ? (
        <Loading label="Loading repair orders" />
      ) : data.orders.length === 0 ? (
        <EmptyState title="No repair orders match">Change the filters{desk ? ', or open a new repair order' : ''}.</EmptyState>
      ) : (
        <>
          {seesStalled && stalledHere > 0 ? (
            <p className="mb-3 rounded-control border-l-8 border-caution-rule bg-caution-soft px-4 py-2 font-medium text-ink" role="status">
              ⚠ {stalledHere} order{stalledHere > 1 ? 's are' : ' is'} past the shop’s limit of {data.settings.stalledDiagnosisHours} h of diagnosis
              {data.settings.stalledDays ? ` or ${data.settings.stalledDays} days open` : ''}: a second pair of eyes now saves the customer’s money.
            </p>
          ) : null}
          <div className="overflow-x-auto rounded-panel border border-line bg-surface">
            <table className="w-full text-left">
              <thead className="border-b border-line text-sm text-ink-muted">
                <tr>
                  <th className="px-3 py-2">Order</th>
                  <th className="px-3 py-2">Customer and unit</th>
                  <th className="px-3 py-2">Complaint</th>
                  <th className="px-3 py-2">Status</th>
                  <th className="px-3 py-2">Technician</th>
                  <th className="px-3 py-2">Time</th>
                  <th className="px-3 py-2">Opened</th>
                </tr>
              </thead>
              <tbody>
                {data.orders.map((o) => (
                  <tr key={o.id} className={o.stalled && seesStalled ? 'border-b border-line bg-caution-soft' : 'border-b border-line'}>
                    <td className="px-3 py-2 font-bold tabular-nums">
                      <Link to={`/repair-orders/${o.id}`} className="inline-flex min-h-11 items-center">
                        {o.number}
                      </Link>
                    </td>
                    <td className="px-3 py-2">
                      <div className="font-medium">{o.customer.name}</div>
                      <div className="text-sm text-ink-muted">{o.units.map((u) => `${u.modelName ?? 'Unit'} · ${u.serialNumber}`).join('; ')}</div>
                    </td>
                    <td className="max-w-80 px-3 py-2">
                      <span className="line-clamp-2">{o.complaint}</span>
                    </td>
                    <td className="px-3 py-2">
                      <div className="flex flex-col items-start gap-1">
                        <StatusTag status={o.status} />
                        {o.stalled && seesStalled ? <StalledTag minutes={o.diagnosisMinutes} /> : null}
                      </div>
                    </td>
                    <td className="px-3 py-2">{o.assignedTech?.name ?? <span className="text-ink-muted">Not assigned</span>}</td>
                    <td className="px-3 py-2 whitespace-nowrap tabular-nums">{hours(o.totalMinutes)}</td>
                    <td className="px-3 py-2 whitespace-nowrap">{formatDate(o.openedAt)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <nav className="mt-3 flex items-center gap-3" aria-label="Pages">
            <Button disabled={page <= 1} onClick={() => set('page', String(page - 1))}>
              Previous
            </Button>
            <span>
              Page {data.page} of {pages} · {data.total} order{data.total === 1 ? '' : 's'}
            </span>
            <Button disabled={page >= pages} onClick={() => set('page', String(page + 1))}>
              Next
            </Button>
          </nav>
        </>
      )}
    </main>
  );
}
