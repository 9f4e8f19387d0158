import { useEffect, useId, useState } from 'react';
import { Link } from 'react-router';
import type { SearchResult } from '@shared/api/harness';
import { WireSwatch } from '@/components';
import { errorMessage } from '@/lib/api';
import { useSearch } from '../api';
import { cardPath } from '../paths';

const matchedWords: Record<string, string> = {
  circuit: 'circuit',
  color: 'wire colour',
  component: 'component',
  label: 'label',
  function: 'function',
  wire: 'wire',
  pin: 'pin',
};

function ResultLine({ r, orderId, onPick }: { r: SearchResult; orderId: string | null; onPick?: () => void }) {
  const ref = r.pinId ? `${r.componentId}.${r.pinId}` : r.componentId;
  return (
    <li>
      <Link
        to={cardPath(r.harnessId, r.revisionId, r.componentId, { pin: r.pinId, order: orderId })}
        onClick={onPick}
        className="touch flex flex-col gap-0.5 rounded-control border border-line bg-surface px-3 py-2 text-ink no-underline hover:bg-sunken"
      >
        <span className="flex flex-wrap items-center gap-2">
          <span className="font-bold">{ref}</span>
          {r.circuit ? <span>circuit {r.circuit}</span> : null}
          {r.color ? <WireSwatch colour={r.color} size="sm" /> : null}
          {r.revisionStatus === 'draft' ? <span className="text-sm">(draft)</span> : null}
        </span>
        <span>{r.function ?? r.label}</span>
        <span className="text-sm text-ink-muted">
          {r.harnessName}
          {r.modelName ? ` · ${r.modelName}` : ''} · matched {matchedWords[r.matched] ?? r.matched}
        </span>
      </Link>
    </li>
  );
}

/**
 * Search every harness of the shop by circuit, wire colour, label or function;
 * each hit opens the pin card of its connector.
 */
export function FindBox({ orderId, autoFocus = false }: { orderId: string | null; autoFocus?: boolean }) {
  const id = useId();
  const [text, setText] = useState('');
  const [q, setQ] = useState('');
  useEffect(() => {
    const t = setTimeout(() => setQ(text), 200);
    return () => clearTimeout(t);
  }, [text]);
  const search = useSearch(q);
  const results = search.data?.results ?? [];
  return (
    <div role="search" className="no-print flex w-full flex-col gap-2">
      <label htmlFor={id} className="font-medium">
        Find a connector: circuit, wire colour, label or function
      </label>
      <input
        id={id}
        type="search"
        value={text}
        onChange={(e) => setText(e.target.value)}
        autoFocus={autoFocus}
        autoComplete="off"
        spellCheck={false}
        placeholder="e.g. 120, RD/WH, X30, attachment power"
        className="block min-h-11 w-full rounded-control border border-field bg-surface px-3 py-2 text-base text-ink placeholder:text-ink-muted"
      />
      {q.trim() ? (
        search.isPending ? (
          <p className="text-ink-muted">Searching…</p>
        ) : search.error ? (
          <p role="alert" className="text-bad">
            ✗ {errorMessage(search.error)}
          </p>
        ) : results.length === 0 ? (
          <p>Nothing found for “{q.trim()}”. Try a circuit number, a colour code like RD/WH, or a word of the function.</p>
        ) : (
          <ul aria-label={`Search results for ${q.trim()}`} className="flex max-h-[60vh] flex-col gap-1 overflow-y-auto">
            {results.map((r, i) => (
              <ResultLine key={`${r.revisionId}-${r.kind}-${r.componentId}-${r.pinId ?? ''}-${i}`} r={r} orderId={orderId} onPick={() => setText('')} />
            ))}
          </ul>
        )
      ) : null}
    </div>
  );
}
