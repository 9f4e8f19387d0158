import { useState } from 'react';
import { Link } from 'react-router';
import { Button, EmptyState, FormError, Loading, PageHeader, Panel } from '@/components';
import { useMe } from '@/lib/me';
import { useCreateCustomer, useCreateUnit, useCustomer, useCustomers } from '@/features/repair-orders';

const inputClass = 'block min-h-11 w-full rounded-control border border-field bg-surface px-3 py-2 text-base text-ink';

/** The shop's customers and their machines and attachments. */
export function Component() {
  const { me } = useMe();
  const desk = me?.role === 'writer' || me?.role === 'lead' || me?.role === 'owner';
  const [q, setQ] = useState('');
  const [page, setPage] = useState(1);
  const list = useCustomers(q, page);
  const [selected, setSelected] = useState<string | null>(null);
  return (
    <main className="flex flex-col gap-4">
      <PageHeader title="Customers" lead="Who brings machines in, how to reach them, and their units." />
      <div className="grid gap-4 lg:grid-cols-[1fr_2fr]">
        <Panel title="Find a customer">
          <input className={inputClass} aria-label="Search customers" placeholder="Name, company or e-mail" value={q} onChange={(e) => { setQ(e.target.value); setPage(1); }} />
          {list.error ? <FormError error={list.error} /> : null}
          {!list.data ? <Loading /> : list.data.customers.length === 0 ? <p className="mt-2 text-ink-muted">No customer matches.</p> : (
            <ul className="mt-2 flex flex-col">
              {list.data.customers.map((c) => (
                <li key={c.id}>
                  <button type="button" className={`min-h-11 w-full rounded-control px-2 text-left hover:bg-sunken ${c.id === selected ? 'bg-accent-soft font-bold' : ''}`} onClick={() => setSelected(c.id)}>
                    {c.name}{c.company ? ` · ${c.company}` : ''}
                  </button>
                </li>
              ))}
            </ul>
          )}
          {list.data && list.data.total > list.data.pageSize ? (
            <div className="mt-2 flex gap-2">
              <Button disabled={page <= 1} onClick={() => setPage(page - 1)}>Previous</Button>
              <Button disabled={page * list.data.pageSize >= list.data.total} onClick={() => setPage(page + 1)}>Next</Button>
            </div>
          ) : null}
          {desk ? <NewCustomerForm onCreated={setSelected} /> : null}
        </Panel>
        {selected ? <CustomerDetail id={selected} desk={desk} /> : <EmptyState title="Pick a customer">Their contacts, units and repair orders show here.</EmptyState>}
      </div>
    </main>
  );
}

function CustomerDetail({ id, desk }: { id: string; desk: boolean }) {
  const c = useCustomer(id);
  if (c.error) return <FormError error={c.error} />;
  if (!c.data) return <Loading />;
  const { customer, units } = c.data;
  return (
    <Panel title={customer.name} description={[customer.company, customer.email, customer.phone].filter(Boolean).join(' · ')} actions={<Link to={`/repair-orders?customerId=${customer.id}&techId=all`}>Repair orders</Link>}>
      {customer.contacts.length ? (
        <ul className="mb-3">{customer.contacts.map((p, i) => <li key={i}>{p.name}{p.role ? `, ${p.role}` : ''}{p.email ? ` · ${p.email}` : ''}{p.phone ? ` · ${p.phone}` : ''}</li>)}</ul>
      ) : null}
      {customer.notes ? <p className="mb-3 text-ink-muted">{customer.notes}</p> : null}
      <h3 className="font-bold">Units</h3>
      {units.length === 0 ? <p className="text-ink-muted">No units yet.</p> : (
        <ul className="flex flex-col gap-1">
          {units.map((u) => <li key={u.id}><strong>{u.modelName ?? 'Unit'}</strong> · serial {u.serialNumber}{u.hourMeter !== null ? ` · ${u.hourMeter} h` : ''}{u.notes ? <span className="block text-sm text-ink-muted">{u.notes}</span> : null}</li>)}
        </ul>
      )}
      {desk ? <NewUnitForm customerId={customer.id} /> : null}
    </Panel>
  );
}

function NewCustomerForm({ onCreated }: { onCreated: (id: string) => void }) {
  const create = useCreateCustomer();
  const [v, setV] = useState({ name: '', company: '', email: '', phone: '', contact: '' });
  const set = (k: keyof typeof v) => (e: { target: { value: string } }) => setV((s) => ({ ...s, [k]: e.target.value }));
  return (
    <form
      className="mt-4 flex flex-col gap-2 border-t border-line pt-3"
      onSubmit={(e) => {
        e.preventDefault();
        create.mutate(
          { name: v.name, company: v.company || null, email: v.email || null, phone: v.phone || null, contacts: v.contact ? [{ name: v.contact, phone: v.phone || null }] : [] },
          { onSuccess: (r) => { onCreated(r.customer.id); setV({ name: '', company: '', email: '', phone: '', contact: '' }); } },
        );
      }}
    >
      <h3 className="font-bold">New customer</h3>
      <label className="flex flex-col gap-1">Name<input className={inputClass} value={v.name} onChange={set('name')} /></label>
      <label className="flex flex-col gap-1">Company<input className={inputClass} value={v.company} onChange={set('company')} /></label>
      <label className="flex flex-col gap-1">E-mail (for reports)<input className={inputClass} type="email" value={v.email} onChange={set('email')} /></label>
      <label className="flex flex-col gap-1">Phone<input className={inputClass} value={v.phone} onChange={set('phone')} /></label>
      <label className="flex flex-col gap-1">Contact person<input className={inputClass} value={v.contact} onChange={set('contact')} /></label>
      {create.error ? <FormError error={create.error} title="The customer was not saved." /> : null}
      <div><Button type="submit" busy={create.isPending}>Save customer</Button></div>
    </form>
  );
}

function NewUnitForm({ customerId }: { customerId: string }) {
  const create = useCreateUnit();
  const [v, setV] = useState({ kind: 'machine', description: '', serialNumber: '', hourMeter: '' });
  const set = (k: keyof typeof v) => (e: { target: { value: string } }) => setV((s) => ({ ...s, [k]: e.target.value }));
  return (
    <form
      className="mt-4 grid gap-2 border-t border-line pt-3 sm:grid-cols-2"
      onSubmit={(e) => {
        e.preventDefault();
        create.mutate(
          { customerId, kind: v.kind as 'machine' | 'attachment', description: v.description || null, serialNumber: v.serialNumber, hourMeter: v.hourMeter ? Number(v.hourMeter) : null },
          { onSuccess: () => setV({ kind: 'machine', description: '', serialNumber: '', hourMeter: '' }) },
        );
      }}
    >
      <h3 className="font-bold sm:col-span-2">New unit</h3>
      <label className="flex flex-col gap-1">Kind<select className={inputClass} value={v.kind} onChange={set('kind')}><option value="machine">Machine</option><option value="attachment">Attachment</option></select></label>
      <label className="flex flex-col gap-1">Maker and model<input className={inputClass} value={v.description} onChange={set('description')} /></label>
      <label className="flex flex-col gap-1">Serial number<input className={inputClass} value={v.serialNumber} onChange={set('serialNumber')} /></label>
      <label className="flex flex-col gap-1">Hour meter<input className={inputClass} inputMode="decimal" value={v.hourMeter} onChange={set('hourMeter')} /></label>
      {create.error ? <div className="sm:col-span-2"><FormError error={create.error} title="The unit was not saved." /></div> : null}
      <div><Button type="submit" busy={create.isPending}>Save unit</Button></div>
    </form>
  );
}
