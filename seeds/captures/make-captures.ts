/**
 * Writes the two demo captures of the KR-T78 bus in the SocketCAN
 * `candump -l` log format, deterministically (same bytes on every run):
 *
 * - aux-rest.log:  engine running, left handle auxiliary roller at rest;
 * - aux-moved.log: the same, with the roller moved to its forward end,
 *   back to rest, to its reverse end and back.
 *
 * Only byte 0 of 0CFF1021 (machine control unit, auxiliary hydraulics
 * command) follows the roller; everything else has the same spread in both
 * (engine speed and torque jitter, a message counter, voltage flicker), as a
 * real pair of captures would. Messages and periods: ../catalogue/kr-t78-bus.ts.
 *
 * Run: npx tsx seeds/captures/make-captures.ts
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';
import { auxiliaryControlSignal, krT78MessagePeriodsMs } from '../catalogue/kr-t78-bus';

export const CAPTURE_SECONDS = 15;
export const REST_START = 1764669120.250000; // invented wall-clock start of the rest capture
export const MOVED_START = 1764669185.480000;

/** mulberry32: a small deterministic generator. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Roller byte at time t (s from start) in the moved capture. */
export function rollerMoved(t: number): number {
  const { rest, forwardEnd, reverseEnd } = auxiliaryControlSignal;
  const ramp = (from: number, to: number, t0: number, t1: number) => from + ((to - from) * (t - t0)) / (t1 - t0);
  let v: number;
  if (t < 2) v = rest;
  else if (t < 3) v = ramp(rest, forwardEnd, 2, 3);
  else if (t < 6) v = forwardEnd;
  else if (t < 7) v = ramp(forwardEnd, rest, 6, 7);
  else if (t < 8) v = rest;
  else if (t < 9) v = ramp(rest, reverseEnd, 8, 9);
  else if (t < 11) v = reverseEnd;
  else if (t < 12) v = ramp(reverseEnd, rest, 11, 12);
  else v = rest;
  return Math.round(v);
}

type Payload = (t: number, n: number, r: () => number) => number[];

function payloads(roller: (t: number) => number): Record<string, Payload> {
  const int = (r: () => number, lo: number, hi: number) => lo + Math.floor(r() * (hi - lo + 1));
  return {
    // Engine speed and torque: about 2450 rpm, torque around 20 %.
    '0CF00400': (_t, _n, r) => {
      const speed = 19600 + int(r, -40, 40);
      return [0xf1, 0x8c, 0x91 + int(r, -2, 2), speed & 0xff, speed >> 8, 0x00, 0xf0, 0xff];
    },
    // Coolant 82 °C.
    '18FEEE00': () => [0x7a, 0x46, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff],
    // Auxiliary hydraulics command: byte 0 follows the roller.
    '0CFF1021': (t) => [roller(t), 0xfc, 0xf0, 0xff, 0xff, 0xff, 0xff, 0xff],
    // Machine status: seat bar lowered, unlocked, park brake released, low range; 14.1-14.3 V; counter.
    '18FF1121': (_t, n, r) => [0x15, 0x8d + int(r, 0, 2), 0xff, 0xff, 0xff, 0xff, 0xff, 0xf0 | (n & 0x0f)],
    // Right joystick centred.
    '18FF1221': () => [0x7d, 0x7d, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff],
    // No active trouble codes.
    '18FECA21': () => [0x00, 0xff, 0x00, 0x00, 0x00, 0x00, 0xff, 0xff],
    // Display settings: flow limit 100 %, drive response normal, brightness 80 %.
    '18FF3028': () => [0x64, 0x01, 0x50, 0xff, 0xff, 0xff, 0xff, 0xff],
    '18FECA28': () => [0x00, 0xff, 0x00, 0x00, 0x00, 0x00, 0xff, 0xff],
  };
}

const hex = (bytes: number[]) => bytes.map((b) => b.toString(16).toUpperCase().padStart(2, '0')).join('');

/** The capture's lines, sorted by time, each `(seconds.micro) can0 ID#DATA`. */
export function makeCapture(start: number, roller: (t: number) => number, seed: number): string[] {
  const r = rng(seed);
  const p = payloads(roller);
  const frames: { us: number; line: string }[] = [];
  const startUs = Math.round(start * 1e6);
  for (const [id, periodMs] of Object.entries(krT78MessagePeriodsMs)) {
    const phaseUs = Math.floor(r() * periodMs * 1000);
    const periodUs = periodMs * 1000;
    for (let n = 0; ; n++) {
      const jitter = Math.round((r() - 0.5) * 400); // ±200 µs
      const offUs = phaseUs + n * periodUs + jitter;
      if (offUs >= CAPTURE_SECONDS * 1e6) break;
      const us = startUs + Math.max(0, offUs);
      frames.push({ us, line: `${id}#${hex(p[id](offUs / 1e6, n, r))}` });
    }
  }
  frames.sort((a, b) => a.us - b.us);
  return frames.map(({ us, line }) => `(${Math.floor(us / 1e6)}.${String(us % 1e6).padStart(6, '0')}) can0 ${line}`);
}

export function restCapture(): string {
  return makeCapture(REST_START, () => auxiliaryControlSignal.rest, 0x7e57).join('\n') + '\n';
}

export function movedCapture(): string {
  return makeCapture(MOVED_START, rollerMoved, 0x30ed).join('\n') + '\n';
}

const isMain = process.argv[1] !== undefined && fileURLToPath(import.meta.url) === process.argv[1];
if (isMain) {
  const dir = dirname(fileURLToPath(import.meta.url));
  for (const [name, text] of [['aux-rest.log', restCapture()], ['aux-moved.log', movedCapture()]] as const) {
    writeFileSync(join(dir, name), text);
    console.log(`${name}: ${text.split('\n').length - 1} lines, ${text.length} bytes`);
  }
}
