import type { PreparedHarness } from '../engine';
import { expectedOhms, expectedVolts, inRange, verdict, type ExpectedRange, type Tolerance } from './expected';

/** One meter reading a tech entered, as the API and the engine's suspects take it. */
export type Observation =
  | { kind: 'volts'; pin: string; state: string; volts: number | null; note?: string }
  | { kind: 'ohms'; a: string; b: string; state: string; ohms: number | null; note?: string }
  | { kind: 'fuse'; fuse: string; blowsOnInsert: boolean; note?: string };

export type MarkedReading = Observation & {
  expected: ExpectedRange | { value: boolean; text: string };
  inRange: boolean | null;
  verdict: string;
};

/** The engine's own observation shape (without our `kind` tag). */
export function toEngineObservation(o: Observation) {
  switch (o.kind) {
    case 'volts':
      return { pin: o.pin, state: o.state, volts: o.volts };
    case 'ohms':
      return { a: o.a, b: o.b, state: o.state, ohms: o.ohms };
    case 'fuse':
      return { fuse: o.fuse, blowsOnInsert: o.blowsOnInsert };
  }
}

/**
 * Marks each reading against what the documented harness should read. Tolerances are a
 * lead's per-pin bands for volts (keyed by pin ref); the rest use the defaults.
 */
export function markObservations(prep: PreparedHarness, observations: Observation[], tolerances: ReadonlyMap<string, Tolerance> = new Map()): MarkedReading[] {
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
    }
  });
}
