import type { ReadingSetView, ReadingView, SuspectView } from '@shared/api/orders';
import { FormError, Loading } from '@/components';
import { formatDateTime } from '@/lib/format';
import { useOrderReadings } from '../api';

const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? String(Math.round(v * 1000) / 1000) : null);

export function expectedWords(expected: unknown, unit: string): string {
  if (expected === null || expected === undefined) return '—';
  if (typeof expected === 'number') return `${num(expected)} ${unit}`.trim();
  if (typeof expected === 'string') return expected;
  const e = expected as Record<string, unknown>;
  const u = typeof e.unit === 'string' ? e.unit : unit;
  if (typeof e.min === 'number' && typeof e.max === 'number') return `${num(e.min)}–${num(e.max)} ${u}`.trim();
  if (typeof e.low === 'number' && typeof e.high === 'number') return `${num(e.low)}–${num(e.high)} ${u}`.trim();
  if (typeof e.value === 'number') return `${num(e.value)}${typeof e.tolerance === 'number' ? ` ± ${num(e.tolerance)}` : ''} ${u}`.trim();
  if (e.value === null) return 'no steady reading';
  return JSON.stringify(expected);
}

const unitOf = (r: ReadingView) => (typeof r.unit === 'string' ? r.unit : r.quantity === 'ohms' || r.kind === 'ohms' ? 'Ω' : 'V');
const pointOf = (r: ReadingView) => [r.pin, r.at, r.point, r.label].find((v) => typeof v === 'string' && v) as string | undefined;
const suspectWords = (s: SuspectView) => {
  const label = [s.label, s.description, s.title, s.fault].find((v) => typeof v === 'string' && v) as string | undefined;
  return label ?? JSON.stringify(s);
};

/** The order's reading sets: each reading with its mark in words and shape, and the suspects at the time. */
export function ReadingSets({ orderId }: { orderId: string }) {
  const q = useOrderReadings(orderId);
  if (q.error) return <FormError error={q.error} title="The readings could not be loaded." />;
  if (!q.data) return <Loading label="Loading readings" />;
  if (!q.data.available) return <p className="text-ink-muted">Readings are not available on this server yet.</p>;
  if (!q.data.readingSets.length) return <p className="text-ink-muted">No readings taken on this job yet. Take them on a pin card or along a walk, on this order.</p>;
  return (
    <div className="flex flex-col gap-4">
      {q.data.readingSets.map((set) => (
        <ReadingSetTable key={set.id} set={set} />
      ))}
    </div>
  );
}

export function ReadingSetTable({ set }: { set: ReadingSetView }) {
  const by = typeof set.takenBy === 'string' ? set.takenBy : set.takenBy?.name;
  return (
    <section>
      <h3 className="font-bold">Taken {formatDateTime(set.takenAt)}{by ? ` by ${by}` : ''}</h3>
      <table className="mt-1 w-full text-left tabular-nums">
        <thead className="text-sm text-ink-muted">
          <tr><th className="py-1 pr-2">Point</th><th className="py-1 pr-2">State</th><th className="py-1 pr-2">Measured</th><th className="py-1 pr-2">Expected</th><th className="py-1">Result</th></tr>
        </thead>
        <tbody>
          {set.readings.map((r, i) => {
            const unit = unitOf(r);
            const value = num(r.value ?? r.measured);
            return (
              <tr key={i} className="border-t border-line">
                <td className="py-1 pr-2 font-medium">{pointOf(r) ?? '—'}</td>
                <td className="py-1 pr-2">{String(r.state ?? '—')}</td>
                <td className="py-1 pr-2">{value !== null ? `${value} ${unit}` : '—'}</td>
                <td className="py-1 pr-2">{expectedWords(r.expected, unit)}</td>
                <td className="py-1 font-bold">
                  {r.inRange === true ? <span className="text-ok">✓ in range</span> : r.inRange === false ? <span className="text-bad">✗ OUT</span> : <span className="text-ink-muted">no check</span>}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {set.suspects?.length ? (
        <div className="mt-2">
          <p className="font-medium">Suspects at the time (most likely first):</p>
          <ol className="list-decimal pl-6">
            {set.suspects.slice(0, 5).map((s, i) => <li key={i}>{suspectWords(s)}</li>)}
          </ol>
        </div>
      ) : null}
    </section>
  );
}
