import { errorMessage } from '@/lib/api';

/**
 * The message for a whole form (or an action) that did not go through.
 * Takes a string, a list of strings, or any thrown value (an ApiError shows its message).
 */
export function FormError({ error, title }: { error: unknown; title?: string }) {
  if (error === null || error === undefined || error === false || error === '') return null;
  const lines = Array.isArray(error) ? error.map(String).filter(Boolean) : [typeof error === 'string' ? error : errorMessage(error)];
  if (lines.length === 0) return null;
  return (
    <div role="alert" className="flex gap-2 rounded-control border-2 border-bad bg-bad-soft px-3 py-2 text-bad">
      <span aria-hidden="true" className="font-bold">
        ✗
      </span>
      <div>
        {title ? <p className="font-bold">{title}</p> : null}
        {lines.map((line, i) => (
          <p key={i}>{line}</p>
        ))}
      </div>
    </div>
  );
}
