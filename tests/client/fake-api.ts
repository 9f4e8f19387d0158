/**
 * A small fake of the Wirewalk API at the network boundary, for client
 * component tests: stub `fetch` with `installFakeApi({...routes})`.
 * Routes are `'METHOD /api/path/:param'` → handler returning { status, body }.
 * Every call is recorded in `calls` (method, path, parsed JSON body).
 */
import { vi } from 'vitest';
import type { Me, Role } from '@shared/api/auth';

export interface FakeCall {
  method: string;
  path: string;
  body: unknown;
}

export interface FakeReply {
  status?: number;
  body?: unknown;
}

export type FakeHandler = (req: { params: Record<string, string>; body: unknown; query: URLSearchParams }) => FakeReply | Promise<FakeReply>;

export function apiError(status: number, code: string, message: string, details?: Array<{ path: string; message: string }>): FakeReply {
  return { status, body: { error: { code, message, ...(details ? { details } : {}) } } };
}

export function fakeMe(role: Role = 'owner', over: Partial<Me> = {}): Me {
  return {
    user: { id: `u-${role}`, email: `${role}@example.com`, name: `${role[0].toUpperCase()}${role.slice(1)} Person` },
    shop: { id: 'shop-1', name: 'Ridgeline Compact Repair' },
    role,
    demo: false,
    ...over,
  };
}

export function installFakeApi(routes: Record<string, FakeHandler>) {
  const calls: FakeCall[] = [];
  const compiled = Object.entries(routes).map(([key, handler]) => {
    const [method, pattern] = key.split(' ');
    const names: string[] = [];
    const re = new RegExp(
      '^' + pattern.replace(/[.*+?^${}()|[\]\\]/g, '\\$&').replace(/:(\w+)/g, (_m, n: string) => (names.push(n), '([^/]+)')) + '$',
    );
    return { method, re, names, handler };
  });

  const fetchMock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = new URL(typeof input === 'string' ? input : input instanceof URL ? input.href : input.url, 'http://localhost');
    const method = (init.method ?? 'GET').toUpperCase();
    let body: unknown = undefined;
    if (typeof init.body === 'string') {
      try {
        body = JSON.parse(init.body);
      } catch {
        body = init.body;
      }
    }
    calls.push({ method, path: url.pathname, body });
    for (const route of compiled) {
      if (route.method !== method) continue;
      const m = route.re.exec(url.pathname);
      if (!m) continue;
      const params = Object.fromEntries(route.names.map((n, i) => [n, decodeURIComponent(m[i + 1])]));
      const reply = await route.handler({ params, body, query: url.searchParams });
      const status = reply.status ?? 200;
      const text = reply.body === undefined ? '' : JSON.stringify(reply.body);
      return new Response(status === 204 ? null : text, { status, headers: { 'Content-Type': 'application/json' } });
    }
    return new Response(JSON.stringify({ error: { code: 'not_found', message: `No fake for ${method} ${url.pathname}` } }), {
      status: 404,
      headers: { 'Content-Type': 'application/json' },
    });
  });
  vi.stubGlobal('fetch', fetchMock);
  return { calls, fetchMock };
}
