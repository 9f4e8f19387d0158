/** Small pieces the catalogue table and the pin card share: identifier with its J1939 split, signals in words. */
import type { MessageView } from '@shared/api/bus';
import type { BusSignal } from '@shared/harness/schema';

const hex2 = (v: number) => '0x' + v.toString(16).toUpperCase().padStart(2, '0');

export function IdentifierCell({ view }: { view: MessageView }) {
  return (
    <div className="flex flex-col">
      <span className="font-mono text-base font-bold tabular">{view.key}</span>
      {view.j1939 ? (
        <span className="text-sm text-ink-muted" data-testid="j1939-split">
          priority {view.j1939.priority} · PGN {view.j1939.pgn} · source {hex2(view.j1939.source)}
          {view.j1939.destination !== null ? ` · destination ${view.j1939.destination === 0xff ? 'global' : hex2(view.j1939.destination)}` : ''}
        </span>
      ) : (
        <span className="text-sm text-ink-muted">11-bit</span>
      )}
    </div>
  );
}

/** "byte 1" (1-based, as people count) or "bits 8–9". */
export function signalWhere(s: BusSignal): string {
  if (s.byte !== undefined && (s.length === undefined || s.length === 8)) return `byte ${s.byte + 1}`;
  if (s.byte !== undefined) return `byte ${s.byte + 1}, ${s.length} bits`;
  if (s.startBit !== undefined && s.length !== undefined) {
    if (s.startBit % 8 === 0 && s.length % 8 === 0) {
      const first = s.startBit / 8 + 1;
      const last = first + s.length / 8 - 1;
      return first === last ? `byte ${first}` : `bytes ${first}–${last}`;
    }
    return `bits ${s.startBit}–${s.startBit + s.length - 1}`;
  }
  return '';
}

export function SignalList({ signals }: { signals: BusSignal[] | undefined }) {
  if (!signals?.length) return <span className="text-ink-muted">No signals documented</span>;
  return (
    <ul className="flex flex-col gap-1">
      {signals.map((s) => (
        <li key={s.name}>
          <span className="font-medium">{s.name}</span> <span className="text-ink-muted">({signalWhere(s)}</span>
          {s.scale !== undefined ? <span className="text-ink-muted">, × {s.scale}{s.offset ? ` ${s.offset > 0 ? '+' : '−'} ${Math.abs(s.offset)}` : ''}{s.unit ? ` ${s.unit}` : ''}</span> : null}
          <span className="text-ink-muted">)</span>
          {s.values ? (
            <span className="block text-sm">
              {Object.entries(s.values)
                .map(([raw, label]) => `${raw} (${hex2(Number(raw))}) ${label}`)
                .join(' · ')}
            </span>
          ) : null}
        </li>
      ))}
    </ul>
  );
}
