import { useState } from 'react';
import { Button, Caution, FormError, Loading, PageHeader, Panel, useToast } from '@/components';
import { useMe } from '@/lib/me';
import { useCreateProcedure, useOrderSettings, useProcedures, useSaveSettings } from '../api';

const inputClass = 'block min-h-11 w-full rounded-control border border-field bg-surface px-3 py-2 text-base text-ink';

/** Checklists a lead writes once and attaches to orders; and the stalled-order limit. */
export function Component() {
  const { me } = useMe();
  const lead = me?.role === 'lead' || me?.role === 'owner';
  const list = useProcedures();
  const create = useCreateProcedure();
  const [title, setTitle] = useState('');
  const [notes, setNotes] = useState('Follow the manufacturer’s procedure in the service manual: it governs over these steps.');
  const [steps, setSteps] = useState('');
  return (
    <main className="flex flex-col gap-4">
      <PageHeader title="Procedures" lead="Checklists for steps a job needs, such as recalibrating a throttle or joystick after a controller is reprogrammed." />
      <Caution caution={{ title: 'The service manual governs', text: 'These checklists remind; the manufacturer’s procedure for the model and software level is what to follow.' }} />
      {list.error ? <FormError error={list.error} /> : null}
      {!list.data ? <Loading /> : list.data.map((p) => (
        <Panel key={p.id} title={p.title} description={p.notes ?? undefined} level={2}>
          <ol className="list-decimal pl-6">{p.steps.map((s, i) => <li key={i}>{s}</li>)}</ol>
        </Panel>
      ))}
      {lead ? (
        <Panel title="New procedure">
          <form
            className="flex flex-col gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              create.mutate({ title, notes: notes || null, steps: steps.split('\n').map((s) => s.trim()).filter(Boolean) }, { onSuccess: () => { setTitle(''); setSteps(''); } });
            }}
          >
            <label className="flex flex-col gap-1">Title<input className={inputClass} value={title} onChange={(e) => setTitle(e.target.value)} /></label>
            <label className="flex flex-col gap-1">Note<textarea className={inputClass} rows={2} value={notes} onChange={(e) => setNotes(e.target.value)} /></label>
            <label className="flex flex-col gap-1">Steps, one a line<textarea className={inputClass} rows={6} value={steps} onChange={(e) => setSteps(e.target.value)} /></label>
            {create.error ? <FormError error={create.error} title="The procedure was not saved." /> : null}
            <div><Button type="submit" tone="primary" busy={create.isPending}>Save procedure</Button></div>
          </form>
        </Panel>
      ) : null}
      {lead ? <StalledSettings /> : null}
    </main>
  );
}

function StalledSettings() {
  const settings = useOrderSettings();
  const save = useSaveSettings();
  const { notify } = useToast();
  const [hoursText, setHours] = useState<string | null>(null);
  const [daysText, setDays] = useState<string | null>(null);
  if (!settings.data) return <Loading />;
  const h = hoursText ?? String(settings.data.stalledDiagnosisHours);
  const d = daysText ?? (settings.data.stalledDays === null ? '' : String(settings.data.stalledDays));
  return (
    <Panel title="When an order is stalled" description="Past this, the order stands out on the lead’s and owner’s lists and the lead gets one e-mail about it.">
      <form
        className="grid gap-2 sm:grid-cols-3"
        onSubmit={(e) => {
          e.preventDefault();
          save.mutate({ stalledDiagnosisHours: Number(h), stalledDays: d ? Number(d) : null, linkDays: settings.data!.linkDays }, { onSuccess: () => notify('Stalled-order limit saved.') });
        }}
      >
        <label className="flex flex-col gap-1">Diagnosis hours<input className={inputClass} inputMode="decimal" value={h} onChange={(e) => setHours(e.target.value)} /></label>
        <label className="flex flex-col gap-1">Or days open (empty: no limit)<input className={inputClass} inputMode="numeric" value={d} onChange={(e) => setDays(e.target.value)} /></label>
        <div className="flex items-end"><Button type="submit" busy={save.isPending}>Save limit</Button></div>
        {save.error ? <div className="sm:col-span-3"><FormError error={save.error} title="The limit was not saved." /></div> : null}
      </form>
    </Panel>
  );
}
