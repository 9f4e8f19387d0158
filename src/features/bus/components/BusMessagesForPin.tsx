/**
 * For a bus cavity on a pin card: the bus checks (ISO 11898-2 levels, SAE J1939-11
 * termination) and the messages the modules on that bus should send, from the revision's
 * catalogue. A tech can mark each message seen or not seen; "not seen" lists what to check
 * on the sending module (its supply, ground and bus pins). Renders nothing for a pin that is
 * not on a bus.
 */
import { useMemo, useState } from 'react';
import { useMutation } from '@tanstack/react-query';
import { messageView, type MessageView } from '@shared/api/bus';
import { busOfPinOrConnector } from '@shared/can/bus-of-pin';
import type { HarnessDocument } from '@shared/harness/schema';
import { Button, FormError, Panel } from '@/components';
import { api } from '@/lib/api';
import { IdentifierCell, SignalList } from './MessageParts';

/** The reading a tech records for one expected message (feeds the suspects as the checks it implies). */
export interface MessageObservation {
  kind: 'message';
  messageId: string;
  seen: boolean;
}

export interface BusMessagesForPinProps {
  revisionId: string;
  /** The revision's document (as GET /api/revisions/:id answers it). */
  document: unknown;
  /** `CONNECTOR.CAVITY`, e.g. `X20.3`, or a connector id (the bus of its first bus cavity). */
  pinRef: string;
  /** Called when the tech marks a message; leave out to keep the marks on this card only. */
  onMessageReading?: (observation: MessageObservation) => void;
  /** Marks already recorded, by message key. */
  seen?: Record<string, boolean>;
  /** Show the bus level and termination checks (leave off where the card shows its own). Default true. */
  showChecks?: boolean;
}

interface MarkedMessage {
  verdict: string;
  inRange: boolean | null;
  advice?: string;
  checks?: { pin: string; role: string; expect: string }[];
}

export function BusMessagesForPin({ revisionId, document, pinRef, onMessageReading, seen: recorded, showChecks = true }: BusMessagesForPinProps) {
  const doc = document as HarnessDocument | null | undefined;
  const bus = useMemo(() => busOfPinOrConnector(doc, pinRef), [doc, pinRef]);
  const [local, setLocal] = useState<Record<string, boolean>>({});
  const [marked, setMarked] = useState<Record<string, MarkedMessage>>({});
  // The server marks the reading against the revision's catalogue (the same evaluation reading sets use).
  const evaluate = useMutation({
    mutationFn: (o: MessageObservation) => api.post<{ readings: MarkedMessage[] }>(`/api/revisions/${revisionId}/evaluate`, { observations: [o] }),
    onSuccess: (out, o) => setMarked((m) => ({ ...m, [o.messageId]: out.readings[0] })),
  });
  const marks = { ...local, ...(recorded ?? {}) };
  const views = useMemo(() => {
    const labels = new Map(bus.modules.map((m) => [m.id, m.label ?? m.id]));
    return bus.messages.map((m) => messageView(m, m.sender ? labels.get(m.sender) ?? m.sender : null));
  }, [bus]);
  if (!bus.line) return null;

  const mark = (v: MessageView, value: boolean) => {
    setLocal((s) => ({ ...s, [v.key]: value }));
    const o: MessageObservation = { kind: 'message', messageId: v.key, seen: value };
    onMessageReading?.(o);
    evaluate.mutate(o);
  };
  const lineName = bus.line === 'can_h' ? 'CAN_H' : 'CAN_L';

  return (
    <Panel title={`Bus messages${pinRef.includes('.') ? ` on ${pinRef} (${lineName})` : ''}`} level={2} className="bus-for-pin" description={`${bus.modules.length} module(s) on this bus: ${bus.modules.map((m) => m.label ?? m.id).join(', ')}`}>
      <div className="flex flex-col gap-4">
        {showChecks ? <section aria-label="Bus checks">
          <h4 className="font-bold">Bus checks</h4>
          <ul className="list-disc pl-5">
            <li>
              Key on, bus idle: {lineName} to ground about <strong className="tabular">2.5 V</strong>; CAN_H and CAN_L add up to about 5 V (ISO 11898-2).
            </li>
            <li>
              Key on, traffic: CAN_H about 3.5 V and CAN_L about 1.5 V when dominant, so a meter reads a little off 2.5 V (ISO 11898-2).
            </li>
            <li>
              Power off: CAN_H to CAN_L about <strong className="tabular">60 Ω</strong> (a 120 Ω terminator at each end; ISO 11898-2, SAE J1939-11). About 120 Ω means one terminator or one half of the bus is missing.
            </li>
          </ul>
        </section> : null}
        {evaluate.error ? <FormError error={evaluate.error} /> : null}
        <section aria-label="Expected messages">
          <h4 className="font-bold">Messages expected on this bus</h4>
          {views.length === 0 ? (
            <p className="text-ink-muted">The catalogue lists no message from {bus.modules.map((m) => m.id).join(', ') || 'these modules'}.</p>
          ) : (
            <ul className="flex flex-col divide-y divide-line">
              {views.map((v) => {
                const state = marks[v.key];
                const mod = bus.modules.find((m) => m.id === v.message.sender);
                return (
                  <li key={v.key} className="flex flex-col gap-2 py-3" data-message={v.key}>
                    <div className="flex flex-wrap items-start justify-between gap-3">
                      <IdentifierCell view={v} />
                      <div className="min-w-0 grow">
                        <div className="font-medium">{v.message.name ?? 'Unnamed message'}</div>
                        <div className="text-sm text-ink-muted">From {v.senderLabel ?? v.message.sender ?? 'an unknown module'}</div>
                      </div>
                      <div className="flex gap-2" role="group" aria-label={`Is ${v.key} on the bus?`}>
                        <Button tone={state === true ? 'primary' : 'secondary'} aria-pressed={state === true} onClick={() => mark(v, true)}>
                          ✓ Seen
                        </Button>
                        <Button tone={state === false ? 'danger' : 'secondary'} aria-pressed={state === false} onClick={() => mark(v, false)}>
                          ✗ Not seen
                        </Button>
                      </div>
                    </div>
                    <SignalList signals={v.message.signals} />
                    {marked[v.key] && state !== undefined ? (
                      <div className={marked[v.key].inRange === false ? 'rounded-control border-2 border-bad p-2' : 'rounded-control border border-line p-2'} role="status">
                        <p className="font-bold">{marked[v.key].inRange === false ? '✗ ' : marked[v.key].inRange ? '✓ ' : ''}{marked[v.key].verdict}</p>
                        {marked[v.key].advice ? <p>{marked[v.key].advice}</p> : null}
                      </div>
                    ) : state === false && mod ? (
                      <p className="rounded-control border border-bad p-2" role="status">
                        A module that should talk and does not points at its power, ground or bus wires. On {mod.label ?? mod.id}: {mod.supply.length ? `${mod.supply.join(', ')} should read powered (battery voltage, key on)` : 'no supply pin is documented'}
                        {mod.ground.length ? `; ${mod.ground.join(', ')} should read about 0 V to chassis` : ''}
                        {mod.canH.length || mod.canL.length ? `; ${[...mod.canH, ...mod.canL].join(', ')} should read about 2.5 V` : ''}.
                      </p>
                    ) : null}
                  </li>
                );
              })}
            </ul>
          )}
        </section>
      </div>
    </Panel>
  );
}
