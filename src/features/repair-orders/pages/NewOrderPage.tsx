import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router';
import { z } from 'zod';
import { orderCreateSchema } from '@shared/api/orders';
import { Button, FormError, PageHeader, Panel, SelectField, TextAreaField, TextField } from '@/components';
import { applyServerErrors } from '@/lib/api';
import { useCreateCustomer, useCreateOrder, useCreateUnit, useCustomer, useCustomers, usePeople } from '../api';

const inputClass = 'block min-h-11 w-full rounded-control border border-field bg-surface px-3 py-2 text-base text-ink';

const formSchema = z.object({
  complaint: z.string().trim().min(1, 'Write down the complaint in the customer’s words').max(4000),
  assignedTechId: z.string(),
  hourMeter: z.string().regex(/^(\d+(\.\d+)?)?$/, 'Hours as a number, like 2150.5'),
  customerNotes: z.string().max(4000),
});
type FormValues = z.infer<typeof formSchema>;

/** The service desk opens an order: customer, unit(s), complaint, technician. */
export function Component() {
  const navigate = useNavigate();
  const [customerQ, setCustomerQ] = useState('');
  const customers = useCustomers(customerQ);
  const [customerId, setCustomerId] = useState<string | null>(null);
  const customer = useCustomer(customerId);
  const [unitIds, setUnitIds] = useState<string[]>([]);
  const people = usePeople();
  const createOrder = useCreateOrder();
  const form = useForm<FormValues>({ resolver: zodResolver(formSchema), defaultValues: { complaint: '', assignedTechId: '', hourMeter: '', customerNotes: '' } });
  const [problem, setProblem] = useState<unknown>(null);

  const submit = form.handleSubmit(async (values) => {
    setProblem(null);
    const body = {
      customerId: customerId ?? '',
      unitIds,
      complaint: values.complaint,
      assignedTechId: values.assignedTechId || null,
      hourMeter: values.hourMeter ? Number(values.hourMeter) : null,
      customerNotes: values.customerNotes || null,
    };
    const check = orderCreateSchema.safeParse(body);
    if (!check.success) {
      setProblem(new Error(check.error.issues.map((i) => (i.path[0] === 'customerId' ? 'Pick a customer' : i.message)).join('. ')));
      return;
    }
    try {
      const r = await createOrder.mutateAsync(body);
      navigate(`/repair-orders/${r.order.id}`);
    } catch (error) {
      const rest = applyServerErrors(error, form.setError, ['complaint', 'assignedTechId', 'hourMeter', 'customerNotes']);
      if (rest.length) setProblem(new Error(rest.join(' ')));
    }
  });

  return (
    <main className="flex max-w-4xl flex-col gap-4">
      <PageHeader title="New repair order" lead="Who brought what in, and what they say is wrong." />
      <Panel title="1. Customer">
        <div className="flex flex-col gap-3">
          <label className="flex flex-col gap-1">
            <span className="font-medium">Find a customer</span>
            <input className={inputClass} value={customerQ} onChange={(e) => setCustomerQ(e.target.value)} placeholder="Name, company or e-mail" />
          </label>
          <ul className="flex flex-wrap gap-2" aria-label="Customers">
            {customers.data?.customers.map((c) => (
              <li key={c.id}>
                <Button
                  tone={c.id === customerId ? 'primary' : 'secondary'}
                  aria-pressed={c.id === customerId}
                  onClick={() => {
                    setCustomerId(c.id);
                    setUnitIds([]);
                  }}
                >
                  {c.name}
                </Button>
              </li>
            ))}
          </ul>
          <NewCustomer onCreated={(id) => { setCustomerId(id); setUnitIds([]); }} />
        </div>
      </Panel>
      {customerId ? (
        <Panel title="2. Unit" description="The machine, the attachment, or both.">
          <ul className="flex flex-col gap-2">
            {customer.data?.units.map((u) => (
              <li key={u.id}>
                <label className="flex min-h-11 items-center gap-3">
                  <input
                    type="checkbox"
                    className="size-5"
                    checked={unitIds.includes(u.id)}
                    onChange={(e) => setUnitIds((ids) => (e.target.checked ? [...ids, u.id] : ids.filter((x) => x !== u.id)))}
                  />
                  <span>
                    <span className="font-medium">{u.modelName ?? 'Unit'}</span> · serial {u.serialNumber}
                    {u.hourMeter !== null ? ` · ${u.hourMeter} h` : ''}
                  </span>
                </label>
              </li>
            ))}
          </ul>
          <NewUnit customerId={customerId} onCreated={(id) => setUnitIds((ids) => [...ids, id])} />
        </Panel>
      ) : null}
      <Panel title="3. Complaint and technician">
        <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
          <TextAreaField control={form.control} name="complaint" label="Complaint" hint="In the customer’s words: what, when, since when." rows={4} />
          <div className="grid gap-3 sm:grid-cols-2">
            <TextField control={form.control} name="hourMeter" label="Hour meter at intake" inputMode="decimal" />
            <SelectField
              control={form.control}
              name="assignedTechId"
              label="Technician"
              options={[{ value: '', label: 'Not assigned yet' }, ...(people.data ?? []).map((p) => ({ value: p.id, label: p.name }))]}
            />
          </div>
          <TextAreaField control={form.control} name="customerNotes" label="Note for the customer (in the report)" rows={2} />
          {problem ? <FormError error={problem} title="The order was not opened." /> : null}
          <div>
            <Button type="submit" tone="primary" busy={createOrder.isPending}>
              Open the repair order
            </Button>
          </div>
        </form>
      </Panel>
    </main>
  );
}

function NewCustomer({ onCreated }: { onCreated: (id: string) => void }) {
  const [open, setOpen] = useState(false);
  const [name, setName] = useState('');
  const [email, setEmail] = useState('');
  const [phone, setPhone] = useState('');
  const create = useCreateCustomer();
  if (!open) return <div><Button onClick={() => setOpen(true)}>New customer…</Button></div>;
  return (
    <fieldset className="grid gap-2 rounded-control border border-line p-3 sm:grid-cols-3">
      <legend className="px-1 font-medium">New customer</legend>
      <label className="flex flex-col gap-1">Name<input className={inputClass} value={name} onChange={(e) => setName(e.target.value)} /></label>
      <label className="flex flex-col gap-1">E-mail<input className={inputClass} type="email" value={email} onChange={(e) => setEmail(e.target.value)} /></label>
      <label className="flex flex-col gap-1">Phone<input className={inputClass} value={phone} onChange={(e) => setPhone(e.target.value)} /></label>
      {create.error ? <div className="sm:col-span-3"><FormError error={create.error} title="The customer was not saved." /></div> : null}
      <div>
        <Button
          busy={create.isPending}
          onClick={async () => {
            try {
              const r = await create.mutateAsync({ name, email: email || null, phone: phone || null, contacts: [] });
              setOpen(false);
              onCreated(r.customer.id);
            } catch {
              // Shown by create.error.
            }
          }}
        >
          Save customer
        </Button>
      </div>
    </fieldset>
  );
}

function NewUnit({ customerId, onCreated }: { customerId: string; onCreated: (id: string) => void }) {
  const [open, setOpen] = useState(false);
  const [description, setDescription] = useState('');
  const [serial, setSerial] = useState('');
  const [hours, setHours] = useState('');
  const [kind, setKind] = useState<'machine' | 'attachment'>('machine');
  const create = useCreateUnit();
  if (!open) return <div className="mt-2"><Button onClick={() => setOpen(true)}>New unit…</Button></div>;
  return (
    <fieldset className="mt-2 grid gap-2 rounded-control border border-line p-3 sm:grid-cols-4">
      <legend className="px-1 font-medium">New unit</legend>
      <label className="flex flex-col gap-1">Kind
        <select className={inputClass} value={kind} onChange={(e) => setKind(e.target.value as 'machine' | 'attachment')}>
          <option value="machine">Machine</option>
          <option value="attachment">Attachment</option>
        </select>
      </label>
      <label className="flex flex-col gap-1">Maker and model<input className={inputClass} value={description} onChange={(e) => setDescription(e.target.value)} /></label>
      <label className="flex flex-col gap-1">Serial number<input className={inputClass} value={serial} onChange={(e) => setSerial(e.target.value)} /></label>
      <label className="flex flex-col gap-1">Hour meter<input className={inputClass} inputMode="decimal" value={hours} onChange={(e) => setHours(e.target.value)} /></label>
      {create.error ? <div className="sm:col-span-4"><FormError error={create.error} title="The unit was not saved." /></div> : null}
      <div>
        <Button
          busy={create.isPending}
          onClick={async () => {
            try {
              const r = await create.mutateAsync({ customerId, kind, description: description || null, serialNumber: serial, hourMeter: hours ? Number(hours) : null });
              setOpen(false);
              onCreated(r.unit.id);
            } catch {
              // Shown by create.error.
            }
          }}
        >
          Save unit
        </Button>
      </div>
    </fieldset>
  );
}
