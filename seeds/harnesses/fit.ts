/**
 * Join an attachment harness to the carrier's harness: the document a tech
 * reads with the attachment on the machine.
 *
 * The attachment document's carrier stand-in (./carrier.ts: `X40` and every
 * `CAR-` component) is dropped, the carrier's own parts that the attachment
 * replaces (the dust cap and its terminator) are dropped, and the attachment
 * half of the plug mates the carrier's real X40. States are paired by the
 * table given. Pure: the inputs are not changed.
 */
import type { HarnessDocument, HarnessState } from '../../shared/harness/schema';
import { isCarrierStandIn } from './carrier';

export interface FittedState {
  id: string;
  label: string;
  /** State of the machine document. */
  machine: string;
  /** State of the attachment document. */
  attachment: string;
}

export interface FitOptions {
  name: string;
  /** Machine components the attachment replaces, e.g. the plug's dust cap and its terminator. */
  removeFromMachine: string[];
  states: FittedState[];
}

function pinComponent(ref: string): string {
  return ref.slice(0, ref.indexOf('.'));
}

export function fitAttachment(machine: HarnessDocument, attachment: HarnessDocument, opts: FitOptions): HarnessDocument {
  const dropMachine = new Set(opts.removeFromMachine);
  const keepMachine = (id: string) => !dropMachine.has(id);
  const keepAttachment = (id: string) => !isCarrierStandIn(id);

  const components = [
    ...machine.components.filter((c) => keepMachine(c.id)),
    ...attachment.components.filter((c) => keepAttachment(c.id)),
  ].map((c) => structuredClone(c));

  const machineWires = machine.wires.filter((w) => keepMachine(pinComponent(w.from)) && keepMachine(pinComponent(w.to)));
  const attachmentWires = attachment.wires.filter((w) => keepAttachment(pinComponent(w.from)) && keepAttachment(pinComponent(w.to)));
  const wires = [...machineWires, ...attachmentWires].map((w) => structuredClone(w));
  const wireIds = new Set(wires.map((w) => w.id));

  const clamps = [...machine.clamps, ...attachment.clamps]
    .map((cl) => ({ ...structuredClone(cl), wires: cl.wires.filter((w) => wireIds.has(w)) }))
    .filter((cl) => cl.wires.length > 0);

  const componentIds = new Set(components.map((c) => c.id));
  const states: HarnessState[] = opts.states.map((fs) => {
    const m = machine.states.find((s) => s.id === fs.machine);
    const a = attachment.states.find((s) => s.id === fs.attachment);
    if (!m || !a) throw new Error(`fitAttachment: no state ${m ? fs.attachment : fs.machine}`);
    const switches: Record<string, string> = {};
    for (const [k, v] of [...Object.entries(m.switches), ...Object.entries(a.switches)]) if (componentIds.has(k)) switches[k] = v;
    const sources: Record<string, number> = {};
    for (const [k, v] of Object.entries(m.sources ?? {})) if (componentIds.has(k)) sources[k] = v;
    const outputs = [...(m.outputs ?? []), ...(a.outputs ?? [])].filter((r) => componentIds.has(pinComponent(r)));
    const unplugged = [...(m.unplugged ?? []), ...(a.unplugged ?? [])].filter((id) => componentIds.has(id));
    return { id: fs.id, label: fs.label, switches, sources, outputs, unplugged };
  });

  return {
    format: 'wirewalk-harness',
    version: 1,
    name: opts.name,
    label: `${machine.label ?? machine.name}; ${attachment.label ?? attachment.name}`,
    notes: `${machine.name} joined at the attachment plug X40 with ${attachment.name}.`,
    nominalVolts: machine.nominalVolts,
    temperatureC: machine.temperatureC,
    components,
    wires,
    clamps,
    states,
  };
}
