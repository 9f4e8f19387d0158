/**
 * The side panel's forms (react-hook-form), checked with the shared harness
 * schemas: what the form holds is turned into the document's shape and
 * parsed by the same zod schema the server uses; every issue lands on its field.
 */
import { useEffect, useId, type ReactNode } from 'react';
import { useController, useForm, type Control, type FieldPath, type FieldValues, type Resolver } from 'react-hook-form';
import {
  clampSchema,
  colourCodes,
  componentPinIds,
  componentSchema,
  stateSchema,
  wireSchema,
  type Clamp,
  type Component,
  type HarnessDocument,
  type HarnessState,
  type Wire,
} from '@shared/harness';
import { Button, SelectField, TextField } from '@/components';
import { cx } from '@/lib/cx';
import {
  cavitiesToText,
  modulePinsToText,
  numberOrUndefined,
  pinsToText,
  positionsToText,
  textOrUndefined,
  textToCavities,
  textToModulePins,
  textToPins,
  textToPositions,
} from '../formats';

type Issue = { path: PropertyKey[]; message: string };

/** A resolver from a function that builds the item and a zod schema that checks it. */
function schemaResolver<V extends FieldValues, T>(
  build: (v: V) => unknown,
  schema: { safeParse: (x: unknown) => { success: true; data: T } | { success: false; error: { issues: Issue[] } } },
  fieldOf: (path: PropertyKey[]) => string,
  extra?: (v: V, item: T) => Record<string, string>,
): Resolver<V> {
  return async (values) => {
    const item = build(values);
    const r = schema.safeParse(item);
    const errors: Record<string, { type: string; message: string }> = {};
    if (!r.success) {
      for (const issue of r.error.issues) {
        const f = fieldOf(issue.path);
        if (!errors[f]) errors[f] = { type: 'schema', message: issue.path.length > 1 ? `${issue.path.slice(1).join('.')}: ${issue.message}` : issue.message };
      }
    } else if (extra) {
      for (const [f, message] of Object.entries(extra(values, r.data))) errors[f] = { type: 'rule', message };
    }
    if (Object.keys(errors).length) return { values: {}, errors: errors as never };
    return { values, errors: {} };
  };
}

const fieldArea = 'block w-full rounded-control border bg-surface px-3 py-2 font-mono text-sm text-ink';

function TextAreaField<T extends FieldValues>({ control, name, label, hint, rows = 4 }: { control: Control<T>; name: FieldPath<T>; label: ReactNode; hint?: ReactNode; rows?: number }) {
  const id = useId();
  const {
    field: { ref, name: fieldName, value, onChange, onBlur },
    fieldState,
  } = useController({ control, name });
  const error = fieldState.error?.message;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="font-medium">
        {label}
      </label>
      <textarea
        id={id}
        rows={rows}
        name={fieldName}
        ref={ref}
        value={value ?? ''}
        onChange={onChange}
        onBlur={onBlur}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-e` : hint ? `${id}-h` : undefined}
        className={cx(fieldArea, error ? 'border-2 border-bad' : 'border-field')}
      />
      {hint ? (
        <p id={`${id}-h`} className="text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-e`} className="text-sm font-medium text-bad">
          <span aria-hidden="true">✗ </span>
          {error}
        </p>
      ) : null}
    </div>
  );
}

function CheckField<T extends FieldValues>({ control, name, label }: { control: Control<T>; name: FieldPath<T>; label: ReactNode }) {
  const {
    field: { value, onChange, onBlur },
  } = useController({ control, name });
  return (
    <label className="flex min-h-11 items-center gap-2">
      <input type="checkbox" className="size-5" checked={!!value} onChange={(e) => onChange(e.target.checked)} onBlur={onBlur} />
      {label}
    </label>
  );
}

const kindWords: Record<Component['kind'], string> = {
  battery: 'Battery', ground: 'Ground', fuse: 'Fuse', resistor: 'Resistor', load: 'Load', splice: 'Splice',
  connector: 'Connector half', switch: 'Switch', relay: 'Relay', module: 'Controller',
};

// ------------------------------------------------------------------ component

export interface ComponentFormValues {
  id: string;
  label: string;
  notes: string;
  volts: string;
  internalOhms: string;
  bondOhms: string;
  amps: string;
  ohms: string;
  watts: string;
  cavities: string;
  matesWith: string;
  contactOhms: string;
  pins: string;
  positions: string;
  coilOhms: string;
  pullInVolts: string;
  normallyClosed: boolean;
  poweredAboveVolts: string;
}

const s = (n: number | undefined) => (n === undefined ? '' : String(n));

export function componentToValues(c: Component): ComponentFormValues {
  const v: ComponentFormValues = {
    id: c.id, label: c.label ?? '', notes: c.notes ?? '', volts: '', internalOhms: '', bondOhms: '', amps: '', ohms: '', watts: '',
    cavities: '', matesWith: '', contactOhms: '', pins: '', positions: '', coilOhms: '', pullInVolts: '', normallyClosed: false, poweredAboveVolts: '',
  };
  switch (c.kind) {
    case 'battery': v.volts = s(c.volts); v.internalOhms = s(c.internalOhms); break;
    case 'ground': v.bondOhms = s(c.bondOhms); break;
    case 'fuse': v.amps = s(c.amps); v.ohms = s(c.ohms); break;
    case 'resistor': v.ohms = s(c.ohms); break;
    case 'load': v.ohms = s(c.ohms); v.watts = s(c.watts); break;
    case 'splice': break;
    case 'connector': v.cavities = cavitiesToText(c.cavities); v.matesWith = c.matesWith ?? ''; v.contactOhms = s(c.contactOhms); break;
    case 'switch': v.pins = pinsToText(c.pins); v.positions = positionsToText(c.positions); v.contactOhms = s(c.contactOhms); break;
    case 'relay': v.coilOhms = s(c.coilOhms); v.pullInVolts = s(c.pullInVolts); v.normallyClosed = !!c.normallyClosed; v.contactOhms = s(c.contactOhms); break;
    case 'module': v.pins = modulePinsToText(c.pins); v.poweredAboveVolts = s(c.poweredAboveVolts); break;
  }
  return v;
}

/** Drops keys whose value is undefined, so the strict schema sees only what was given. */
function clean<T extends Record<string, unknown>>(o: T): T {
  for (const k of Object.keys(o)) if (o[k] === undefined) delete o[k];
  return o;
}

export function valuesToComponent(v: ComponentFormValues, before: Component): Component {
  const common = { id: v.id.trim(), label: textOrUndefined(v.label), notes: textOrUndefined(v.notes), function: before.function, circuit: before.circuit };
  const n = numberOrUndefined;
  switch (before.kind) {
    case 'battery': return clean({ ...common, kind: 'battery', volts: n(v.volts) as number, internalOhms: n(v.internalOhms) });
    case 'ground': return clean({ ...common, kind: 'ground', bondOhms: n(v.bondOhms) });
    case 'fuse': return clean({ ...common, kind: 'fuse', amps: n(v.amps) as number, ohms: n(v.ohms) });
    case 'resistor': return clean({ ...common, kind: 'resistor', ohms: n(v.ohms) as number });
    case 'load': return clean({ ...common, kind: 'load', ohms: n(v.ohms), watts: n(v.watts) });
    case 'splice': return clean({ ...common, kind: 'splice' });
    case 'connector': return clean({ ...common, kind: 'connector', cavities: textToCavities(v.cavities, before.cavities), matesWith: textOrUndefined(v.matesWith), contactOhms: n(v.contactOhms) });
    case 'switch': return clean({ ...common, kind: 'switch', pins: textToPins(v.pins), positions: textToPositions(v.positions), contactOhms: n(v.contactOhms) });
    case 'relay': return clean({ ...common, kind: 'relay', coilOhms: n(v.coilOhms) as number, pullInVolts: n(v.pullInVolts), normallyClosed: v.normallyClosed || undefined, contactOhms: n(v.contactOhms) });
    case 'module': return clean({ ...common, kind: 'module', pins: textToModulePins(v.pins), poweredAboveVolts: n(v.poweredAboveVolts) });
  }
}

export function ComponentForm({ component, doc, onApply, onRemove }: { component: Component; doc: HarnessDocument; onApply: (next: Component) => void; onRemove: () => void }) {
  const form = useForm<ComponentFormValues>({
    defaultValues: componentToValues(component),
    mode: 'onBlur',
    resolver: schemaResolver<ComponentFormValues, Component>(
      (v) => valuesToComponent(v, component),
      componentSchema as never,
      (path) => String(path[0] ?? 'id'),
      (_v, next) => {
        const errs: Record<string, string> = {};
        if (next.id !== component.id && doc.components.some((c) => c.id === next.id)) errs.id = `${next.id} is already on this drawing`;
        const pins = componentPinIds(next);
        const dup = pins.find((p, i) => pins.indexOf(p) !== i);
        if (dup) errs[next.kind === 'connector' ? 'cavities' : 'pins'] = `Pin ${dup} is listed twice`;
        if (next.kind === 'connector' && next.matesWith === next.id) errs.matesWith = 'A half cannot mate with itself';
        return errs;
      },
    ),
  });
  useEffect(() => form.reset(componentToValues(component)), [component, form]);
  const k = component.kind;
  const c = form.control;
  const connectors = doc.components.filter((x) => x.kind === 'connector' && x.id !== component.id);
  return (
    <form
      className="flex flex-col gap-3"
      aria-label={`${kindWords[k]} ${component.id}`}
      onSubmit={form.handleSubmit((v) => onApply(valuesToComponent(v, component)))}
    >
      <p className="text-sm font-bold uppercase tracking-wide text-ink-muted">{kindWords[k]}</p>
      <TextField control={c} name="id" label="Id" autoComplete="off" />
      <TextField control={c} name="label" label="Label" autoComplete="off" />
      {k === 'battery' ? (
        <>
          <TextField control={c} name="volts" label="Volts at rest" inputMode="decimal" />
          <TextField control={c} name="internalOhms" label="Internal resistance (Ω)" inputMode="decimal" hint="Leave empty for 0" />
        </>
      ) : null}
      {k === 'ground' ? <TextField control={c} name="bondOhms" label="Bond resistance to chassis (Ω)" inputMode="decimal" hint="Leave empty for 0" /> : null}
      {k === 'fuse' ? (
        <>
          <TextField control={c} name="amps" label="Rating (A)" inputMode="decimal" />
          <TextField control={c} name="ohms" label="Cold resistance (Ω)" inputMode="decimal" hint="Leave empty for 0.005" />
        </>
      ) : null}
      {k === 'resistor' ? <TextField control={c} name="ohms" label="Resistance (Ω)" inputMode="decimal" hint="A bus terminator is 120" /> : null}
      {k === 'load' ? (
        <>
          <TextField control={c} name="ohms" label="Resistance (Ω)" inputMode="decimal" />
          <TextField control={c} name="watts" label="Or power at nominal volts (W)" inputMode="decimal" />
        </>
      ) : null}
      {k === 'connector' ? (
        <>
          <TextAreaField control={c} name="cavities" label="Cavities, in order" hint="One per line: number, then what it carries after a colon (3: Work light feed)" rows={5} />
          <SelectField control={c} name="matesWith" label="Mates with" options={[{ value: '', label: 'Not mated on this drawing' }, ...connectors.map((x) => ({ value: x.id, label: `${x.id}${x.label ? ` (${x.label})` : ''}` }))]} />
          <TextField control={c} name="contactOhms" label="Contact resistance per cavity (Ω)" inputMode="decimal" hint="Leave empty for 0" />
        </>
      ) : null}
      {k === 'switch' ? (
        <>
          <TextField control={c} name="pins" label="Pins" hint="Separated by commas: B, IGN, ACC" autoComplete="off" />
          <TextAreaField control={c} name="positions" label="Positions and what they close" hint="One per line; the first is the default: on: B-IGN, B-ACC" />
          <TextField control={c} name="contactOhms" label="Contact resistance (Ω)" inputMode="decimal" hint="Leave empty for 0" />
        </>
      ) : null}
      {k === 'relay' ? (
        <>
          <TextField control={c} name="coilOhms" label="Coil resistance (Ω)" inputMode="decimal" />
          <TextField control={c} name="pullInVolts" label="Pull-in volts" inputMode="decimal" hint="Leave empty for 60 % of nominal" />
          <CheckField control={c} name="normallyClosed" label="Has a normally closed contact (87a)" />
          <TextField control={c} name="contactOhms" label="Contact resistance (Ω)" inputMode="decimal" hint="Leave empty for 0" />
        </>
      ) : null}
      {k === 'module' ? (
        <>
          <TextAreaField
            control={c}
            name="pins"
            label="Pins, in order"
            rows={6}
            hint="One per line: id, role (supply, ground, can_h, can_l, output, ref5, input), values, then a colon and the function: 1 supply 150: Supply · 4 output from=1"
          />
          <TextField control={c} name="poweredAboveVolts" label="Powered above (V)" inputMode="decimal" hint="Leave empty for half of nominal" />
        </>
      ) : null}
      <TextAreaField control={c} name="notes" label="Notes" rows={2} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" tone="primary">
          Apply
        </Button>
        <Button type="button" tone="danger" onClick={onRemove}>
          Remove {component.id}
        </Button>
      </div>
    </form>
  );
}

// ------------------------------------------------------------------ wire

export interface WireFormValues {
  id: string;
  base: string;
  stripe: string;
  sizeUnit: 'mm2' | 'awg';
  size: string;
  lengthM: string;
  circuit: string;
  label: string;
  ohms: string;
  notes: string;
}

export function wireToValues(w: Wire): WireFormValues {
  const [base = '', stripe = ''] = (w.color ?? '').split('/');
  return {
    id: w.id, base, stripe, sizeUnit: 'awg' in w.size ? 'awg' : 'mm2', size: 'awg' in w.size ? String(w.size.awg) : String(w.size.mm2),
    lengthM: String(w.lengthM), circuit: w.circuit ?? '', label: w.label ?? '', ohms: s(w.ohms), notes: w.notes ?? '',
  };
}

export function valuesToWire(v: WireFormValues, before: Wire): Wire {
  const n = numberOrUndefined(v.size) as number;
  return clean({
    id: v.id.trim(),
    from: before.from,
    to: before.to,
    color: v.base ? (v.stripe ? `${v.base}/${v.stripe}` : v.base) : undefined,
    size: v.sizeUnit === 'awg' ? { awg: n } : { mm2: n },
    lengthM: numberOrUndefined(v.lengthM) as number,
    ohms: numberOrUndefined(v.ohms),
    circuit: textOrUndefined(v.circuit),
    label: textOrUndefined(v.label),
    function: before.function,
    notes: textOrUndefined(v.notes),
  }) as Wire;
}

const colourNames: Record<string, string> = {
  BK: 'black', BN: 'brown', RD: 'red', OG: 'orange', YE: 'yellow', GN: 'green', BU: 'blue', VT: 'violet', GY: 'grey', WH: 'white', PK: 'pink', GD: 'gold', TQ: 'turquoise', SR: 'silver', GNYE: 'green-yellow',
};
const colourOptions = colourCodes.map((c) => ({ value: c, label: `${c} ${colourNames[c]}` }));

export function WireForm({ wire, doc, onApply, onRemove }: { wire: Wire; doc: HarnessDocument; onApply: (next: Wire) => void; onRemove: () => void }) {
  const form = useForm<WireFormValues>({
    defaultValues: wireToValues(wire),
    mode: 'onBlur',
    resolver: schemaResolver<WireFormValues, Wire>(
      (v) => valuesToWire(v, wire),
      wireSchema as never,
      (path) => {
        const f = String(path[0] ?? 'id');
        return f === 'color' ? 'stripe' : f;
      },
      (v, next) => {
        const errs: Record<string, string> = {};
        if (next.id !== wire.id && doc.wires.some((w) => w.id === next.id)) errs.id = `${next.id} is already on this drawing`;
        if (v.stripe && !v.base) errs.base = 'Pick the base colour first';
        return errs;
      },
    ),
  });
  useEffect(() => form.reset(wireToValues(wire)), [wire, form]);
  const c = form.control;
  return (
    <form className="flex flex-col gap-3" aria-label={`Wire ${wire.id}`} onSubmit={form.handleSubmit((v) => onApply(valuesToWire(v, wire)))}>
      <p className="text-sm font-bold uppercase tracking-wide text-ink-muted">Wire</p>
      <p className="text-sm">
        From <strong>{wire.from}</strong> to <strong>{wire.to}</strong>
        <span className="block text-ink-muted">Drag an end of the wire on the drawing to move it to another pin.</span>
      </p>
      <TextField control={c} name="id" label="Id" autoComplete="off" />
      <div className="grid grid-cols-2 gap-2">
        <SelectField control={c} name="base" label="Colour" options={[{ value: '', label: 'Not known' }, ...colourOptions]} />
        <SelectField control={c} name="stripe" label="Stripe" options={[{ value: '', label: 'None' }, ...colourOptions.filter((o) => o.value !== 'GNYE')]} />
      </div>
      <div className="grid grid-cols-2 gap-2">
        <TextField control={c} name="size" label="Size" inputMode="decimal" />
        <SelectField control={c} name="sizeUnit" label="Unit" options={[{ value: 'mm2', label: 'mm²' }, { value: 'awg', label: 'AWG' }]} />
      </div>
      <TextField control={c} name="lengthM" label="Length (m)" inputMode="decimal" />
      <TextField control={c} name="circuit" label="Circuit" autoComplete="off" />
      <TextField control={c} name="label" label="Label" autoComplete="off" />
      <TextField control={c} name="ohms" label="Measured resistance (Ω)" inputMode="decimal" hint="Leave empty to compute it from size and length" />
      <TextAreaField control={c} name="notes" label="Notes" rows={2} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" tone="primary">
          Apply
        </Button>
        <Button type="button" tone="danger" onClick={onRemove}>
          Remove {wire.id}
        </Button>
      </div>
    </form>
  );
}

// ------------------------------------------------------------------ clamp

export interface ClampFormValues {
  id: string;
  label: string;
  wires: string;
  at: string;
  notes: string;
}

export function ClampForm({ clamp, doc, isNew, onApply, onRemove }: { clamp: Clamp; doc: HarnessDocument; isNew: boolean; onApply: (next: Clamp) => void; onRemove?: () => void }) {
  const build = (v: ClampFormValues): Clamp =>
    clean({ id: v.id.trim(), label: textOrUndefined(v.label), wires: textToPins(v.wires), at: numberOrUndefined(v.at), notes: textOrUndefined(v.notes), function: clamp.function, circuit: clamp.circuit }) as Clamp;
  const toValues = (x: Clamp): ClampFormValues => ({ id: x.id, label: x.label ?? '', wires: x.wires.join(', '), at: s(x.at), notes: x.notes ?? '' });
  const form = useForm<ClampFormValues>({
    defaultValues: toValues(clamp),
    resolver: schemaResolver<ClampFormValues, Clamp>(build, clampSchema as never, (p) => String(p[0] ?? 'id'), (_v, next) => {
      const errs: Record<string, string> = {};
      if ((isNew || next.id !== clamp.id) && doc.clamps.some((x) => x.id === next.id)) errs.id = `${next.id} is already on this drawing`;
      const missing = next.wires.filter((w) => !doc.wires.some((x) => x.id === w));
      if (missing.length) errs.wires = `No wire ${missing.join(', ')} on this drawing`;
      return errs;
    }),
  });
  useEffect(() => form.reset(toValues(clamp)), [clamp, form]);
  const c = form.control;
  return (
    <form className="flex flex-col gap-3" aria-label={`Clamp ${clamp.id}`} onSubmit={form.handleSubmit((v) => onApply(build(v)))}>
      <p className="text-sm font-bold uppercase tracking-wide text-ink-muted">Clamp</p>
      <TextField control={c} name="id" label="Id" autoComplete="off" />
      <TextField control={c} name="label" label="Where it is" autoComplete="off" hint="Rear bracket, engine bay" />
      <TextField control={c} name="wires" label="Wires through it" autoComplete="off" hint="Wire ids, separated by commas" />
      <TextField control={c} name="at" label="Place along the wires (0 to 1)" inputMode="decimal" hint="Leave empty for the middle (0.5)" />
      <TextAreaField control={c} name="notes" label="Notes" rows={2} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" tone="primary">
          {isNew ? 'Add clamp' : 'Apply'}
        </Button>
        {onRemove ? (
          <Button type="button" tone="danger" onClick={onRemove}>
            Remove {clamp.id}
          </Button>
        ) : null}
      </div>
    </form>
  );
}

// ------------------------------------------------------------------ state

export interface StateFormValues {
  id: string;
  label: string;
  switches: Record<string, string>;
  sources: Record<string, string>;
  outputs: Record<string, boolean>;
  unplugged: Record<string, boolean>;
}

/** Record keys with dots or odd characters would confuse the form paths: keys are escaped. */
const ek = (k: string) => `k_${k.replace(/[^A-Za-z0-9_]/g, (ch) => `$${ch.charCodeAt(0)}$`)}`;
const dk = (k: string) => k.slice(2).replace(/\$(\d+)\$/g, (_m, code) => String.fromCharCode(Number(code)));

export function StateForm({ state, doc, isNew, onApply, onRemove }: { state: HarnessState; doc: HarnessDocument; isNew: boolean; onApply: (next: HarnessState) => void; onRemove?: () => void }) {
  const switches = doc.components.filter((c) => c.kind === 'switch');
  const batteries = doc.components.filter((c) => c.kind === 'battery');
  const connectors = doc.components.filter((c) => c.kind === 'connector');
  const outputs = doc.components.flatMap((c) => (c.kind === 'module' ? c.pins.filter((p) => p.role === 'output').map((p) => `${c.id}.${p.id}`) : []));
  const toValues = (x: HarnessState): StateFormValues => ({
    id: x.id,
    label: x.label ?? '',
    switches: Object.fromEntries(switches.map((sw) => [ek(sw.id), x.switches[sw.id] ?? ''])),
    sources: Object.fromEntries(batteries.map((b) => [ek(b.id), s(x.sources?.[b.id])])),
    outputs: Object.fromEntries(outputs.map((o) => [ek(o), !!x.outputs?.includes(o)])),
    unplugged: Object.fromEntries(connectors.map((cn) => [ek(cn.id), !!x.unplugged?.includes(cn.id)])),
  });
  const build = (v: StateFormValues): HarnessState => {
    const sw: Record<string, string> = {};
    for (const [k, val] of Object.entries(v.switches ?? {})) if (val) sw[dk(k)] = val;
    const src: Record<string, number> = {};
    for (const [k, val] of Object.entries(v.sources ?? {})) {
      const n = numberOrUndefined(val);
      if (n !== undefined) src[dk(k)] = n;
    }
    const outs = Object.entries(v.outputs ?? {}).filter(([, on]) => on).map(([k]) => dk(k));
    const unp = Object.entries(v.unplugged ?? {}).filter(([, on]) => on).map(([k]) => dk(k));
    return clean({
      id: v.id.trim(),
      label: textOrUndefined(v.label),
      switches: sw,
      sources: Object.keys(src).length || state.sources ? src : undefined,
      outputs: outs.length || state.outputs ? outs : undefined,
      unplugged: unp.length || state.unplugged ? unp : undefined,
      notes: state.notes,
      function: state.function,
      circuit: state.circuit,
    }) as HarnessState;
  };
  const form = useForm<StateFormValues>({
    defaultValues: toValues(state),
    resolver: schemaResolver<StateFormValues, HarnessState>(build, stateSchema as never, (p) => String(p[0] ?? 'id'), (_v, next) => {
      const errs: Record<string, string> = {};
      if ((isNew || next.id !== state.id) && doc.states.some((x) => x.id === next.id)) errs.id = `${next.id} is already a state of this drawing`;
      return errs;
    }),
  });
  // toValues is rebuilt on every render from `state` and `doc`, which are the real dependencies.
  // eslint-disable-next-line react-hooks/exhaustive-deps
  useEffect(() => form.reset(toValues(state)), [state, doc, form]);
  const c = form.control;
  return (
    <form className="flex flex-col gap-3" aria-label={`State ${state.id}`} onSubmit={form.handleSubmit((v) => onApply(build(v)))}>
      <TextField control={c} name="id" label="Id" autoComplete="off" hint="key_off, key_on, running …" />
      <TextField control={c} name="label" label="Name" autoComplete="off" />
      {switches.map((sw) =>
        sw.kind === 'switch' ? (
          <SelectField
            key={sw.id}
            control={c}
            name={`switches.${ek(sw.id)}` as FieldPath<StateFormValues>}
            label={`Switch ${sw.id}${sw.label ? ` (${sw.label})` : ''}`}
            options={[{ value: '', label: `Default (${Object.keys(sw.positions)[0] ?? 'none'})` }, ...Object.keys(sw.positions).map((p) => ({ value: p, label: p }))]}
          />
        ) : null,
      )}
      {batteries.map((b) => (
        <TextField key={b.id} control={c} name={`sources.${ek(b.id)}` as FieldPath<StateFormValues>} label={`${b.id} volts in this state`} inputMode="decimal" hint="Leave empty for the battery's own volts (14.2 with the engine running and charging)" />
      ))}
      {outputs.length ? (
        <fieldset>
          <legend className="font-medium">Controller outputs switched on</legend>
          {outputs.map((o) => (
            <CheckField key={o} control={c} name={`outputs.${ek(o)}` as FieldPath<StateFormValues>} label={o} />
          ))}
        </fieldset>
      ) : null}
      {connectors.length ? (
        <fieldset>
          <legend className="font-medium">Connector halves unplugged</legend>
          {connectors.map((cn) => (
            <CheckField key={cn.id} control={c} name={`unplugged.${ek(cn.id)}` as FieldPath<StateFormValues>} label={cn.id} />
          ))}
        </fieldset>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" tone="primary">
          {isNew ? 'Add state' : 'Apply'}
        </Button>
        {onRemove ? (
          <Button type="button" tone="danger" onClick={onRemove}>
            Remove state
          </Button>
        ) : null}
      </div>
    </form>
  );
}
