import { readingExpectedText, readingMeasuredText, readingPointText, readingStateText, suspectText, type ReadingSetView } from '@shared/api/orders';
import { FormError, Loading } from '@/components';
import { formatDateTime } from '@/lib/format';
import { useOrderReadings } from '../api';

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
            return (
              <tr key={i} className="border-t border-line">
                <td className="py-1 pr-2 font-medium">{readingPointText(r)}</td>
                <td className="py-1 pr-2">{readingStateText(r)}</td>
                <td className="py-1 pr-2">{readingMeasuredText(r)}</td>
                <td className="py-1 pr-2">{readingExpectedText(r)}</td>
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
            {set.suspects.slice(0, 5).map((s, i) => <li key={i}>{suspectText(s)}</li>)}
          </ol>
        </div>
      ) : null}
    </section>
  );
}
