/** Addresses of the tech's pages; a pin card's address is its share link. */

function query(params: Record<string, string | null | undefined>): string {
  const q = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v) q.set(k, v);
  const s = q.toString();
  return s ? `?${s}` : '';
}

/** `/pin-cards/:harnessId/:revisionId/:connectorId` (optionally `?pin=3&order=ID`). */
export function cardPath(harnessId: string, revisionId: string, connectorId: string, extra: { pin?: string | null; order?: string | null; state?: string | null } = {}): string {
  return `/pin-cards/${harnessId}/${revisionId}/${encodeURIComponent(connectorId)}${query({ state: extra.state, pin: extra.pin, order: extra.order })}`;
}

/** `/walk?revision=&from=&to=&state=&order=` */
export function walkPath(revisionId: string, extra: { from?: string | null; to?: string | null; state?: string | null; order?: string | null } = {}): string {
  return `/walk${query({ revision: revisionId, from: extra.from, to: extra.to, state: extra.state, order: extra.order })}`;
}

export const findPath = (order?: string | null) => `/pin-cards${query({ order })}`;
