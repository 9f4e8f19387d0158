import type { PreparedHarness } from '../engine';
import { modulePins } from '../can/bus-of-pin';
import { expectedOhms, expectedVolts, inRange, verdict, type ExpectedRange, type Tolerance } from './expected';

/** One meter reading a tech entered, as the API and the engine's suspects take it. */
export type Observation =
  | { kind: 'volts'; pin: string; state: string; volts: number | null; note?: string }
  | { kind: 'ohms'; a: string; b: string; state: string; ohms: number | null; note?: string }
  | { kind: 'fuse'; fuse: string; blowsOnInsert: boolean; note?: string };

/** A catalogued bus message (its identifier, `0CFF1021`) seen or not seen on the bus. */
export type MessageObservation = { kind: 'message'; messageId: string; seen: boolean; note?: string };

/** Every reading a set may hold: meter readings and bus message checks. */
export type ReadingObservation = Observation | MessageObservation;

/** What a "not seen" message implies: the pins of the sending module to check, and what they should read. */
export interface ImpliedCheck {
  pin: string;
  role: 'supply' | 'ground' | 'can_h' | 'can_l';
  expect: string;
}

export type MarkedReading = ReadingObservation & {
  expected: ExpectedRange | { value: boolean; text: string };
  inRange: boolean | null;
  verdict: string;
  /** For a message not seen: plain-words advice and the checks it implies on the sender. */
  advice?: string;
  checks?: ImpliedCheck[];
};

/**
 * The engine's own observation shape (without our `kind` tag); null for a message reading,
 * which the engine's suspects do not take (it is marked with the checks it implies instead).
 */
export function toEngineObservation<O extends ReadingObservation>(o: O): O extends MessageObservation ? null : EngineObservation {
  return engineShape(o) as O extends MessageObservation ? null : EngineObservation;
}

function engineShape(o: ReadingObservation): EngineObservation | null {
  switch (o.kind) {
    case 'volts':
      return { pin: o.pin, state: o.state, volts: o.volts };
    case 'ohms':
      return { a: o.a, b: o.b, state: o.state, ohms: o.ohms };
    case 'fuse':
      return { fuse: o.fuse, blowsOnInsert: o.blowsOnInsert };
    case 'message':
      return null;
  }
}

type EngineObservation =
  | { pin: string; state: string; volts: number | null }
  | { a: string; b: string; state: string; ohms: number | null }
  | { fuse: string; blowsOnInsert: boolean };

const keyOf = (id: string, extended: boolean) => {
  const v = parseInt(id.replace(/^0x/i, ''), 16);
  return Number.isFinite(v) ? v.toString(16).toUpperCase().padStart(extended ? 8 : 3, '0') : id.toUpperCase();
};

/** A message reading marked against the catalogue: not seen → the sender's supply, ground and bus pins to check. */
function markMessage(prep: PreparedHarness, o: MessageObservation): MarkedReading {
  const key = o.messageId.replace(/^0x/i, '').toUpperCase();
  const msg = (prep.doc.messages ?? []).find((m) => keyOf(m.id, m.extended) === key);
  const expected = { value: true, text: 'seen on the bus' };
  if (!msg) return { ...o, expected, inRange: null, verdict: `${key} is not in this revision's message catalogue` };
  if (o.seen) return { ...o, expected, inRange: true, verdict: `OK: ${key} seen on the bus` };
  const sender = msg.sender ? prep.doc.components.find((c) => c.id === msg.sender) : undefined;
  const pins = sender ? modulePins(sender) : null;
  const checks: ImpliedCheck[] = pins
    ? [
        ...pins.supply.map((pin) => ({ pin, role: 'supply' as const, expect: 'powered: battery voltage with the key on' })),
        ...pins.ground.map((pin) => ({ pin, role: 'ground' as const, expect: 'about 0 V to chassis' })),
        ...pins.canH.map((pin) => ({ pin, role: 'can_h' as const, expect: 'about 2.5 V to ground, bus idle (ISO 11898-2)' })),
        ...pins.canL.map((pin) => ({ pin, role: 'can_l' as const, expect: 'about 2.5 V to ground, bus idle (ISO 11898-2)' })),
      ]
    : [];
  const who = sender ? `${sender.label ?? sender.id} (${sender.id})` : 'its sender';
  const list = checks.length ? ` Check ${checks.map((c) => `${c.pin} ${c.expect}`).join('; ')}.` : '';
  return {
    ...o,
    expected,
    inRange: false,
    verdict: `OUT: ${key} not seen, expected from ${who}`,
    advice: `A module that should talk and does not points at its power, ground or bus wires.${list}`,
    checks,
  };
}

/**
 * Marks each reading against what the documented harness should read. Tolerances are a
 * lead's per-pin bands for volts (keyed by pin ref); the rest use the defaults.
 */
export function markObservations(prep: PreparedHarness, observations: ReadingObservation[], tolerances: ReadonlyMap<string, Tolerance> = new Map()): MarkedReading[] {
  const voltsByState = new Map<string, Map<string, number | null>>();
  const voltsOf = (state: string, pin: string) => {
    let pins = voltsByState.get(state);
    if (!pins) {
      pins = new Map((prep.readings(state)?.pins ?? []).map((p) => [p.ref, p.volts]));
      voltsByState.set(state, pins);
    }
    return pins.has(pin) ? pins.get(pin)! : null;
  };
  return observations.map((o): MarkedReading => {
    switch (o.kind) {
      case 'volts': {
        const range = expectedVolts(voltsOf(o.state, o.pin), tolerances.get(o.pin));
        const ok = inRange(range, o.volts);
        return { ...o, expected: range, inRange: ok, verdict: verdict(range, o.volts, ok) };
      }
      case 'ohms': {
        const range = expectedOhms(prep.ohms(o.a, o.b, o.state));
        const ok = inRange(range, o.ohms);
        return { ...o, expected: range, inRange: ok, verdict: verdict(range, o.ohms, ok) };
      }
      case 'fuse': {
        // A sound harness never blows a correctly rated fuse on insert.
        const ok = !o.blowsOnInsert;
        const text = ok ? 'holds' : 'blows on insert';
        return { ...o, expected: { value: false, text: 'holds when fitted' }, inRange: ok, verdict: `${ok ? 'OK' : 'OUT'}: fuse ${text}, expected it to hold` };
      }
      case 'message':
        return markMessage(prep, o);
    }
  });
}
