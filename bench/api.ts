/**
 * Bench: the harness API over HTTP on loopback, against a private MariaDB on a free port.
 * - api.import: POST /api/harnesses/import of make_harness.py 1000 (target ≤ 10 s)
 * - api.readings: GET readings of a published 100-circuit harness, 50 concurrent clients
 *   (autocannon), p95 ≤ 50 ms, no errors
 * - api.search: a pin lookup by search (`XA50.1`), the same load and target
 */
import { fork } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { isDeepStrictEqual } from 'node:util';
import autocannon from 'autocannon';
import { createApp } from '../server/app';
import { loadConfig } from '../server/config';
import type { AppDeps } from '../server/deps';
import { createDb } from '../server/db/client';
import { freePort, startPrivateMariaDb } from '../server/db/mariadb';
import { runMigrations } from '../server/db/migrate';
import type { Mailer } from '../server/mail/mailer';
import { diskStorage } from '../server/storage';
import { DEMO_PASSWORD, demoShop, seedShop } from '../seeds/index';
import { makeHarnessText } from '../tests/support/make-harness';

type Result = { bench: string; [k: string]: unknown };


const percentile = (sorted: number[], p: number) => (sorted.length ? sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)] : NaN);
const round = (n: number) => Math.round(n * 10) / 10;

/** CPU milliseconds (user + system) a process has used so far, from /proc (Linux); NaN elsewhere. */
function cpuMs(pid: number | undefined): number {
  if (pid === undefined) return NaN;
  try {
    // Fields after the command name's closing parenthesis: utime and stime are the 12th and 13th, in clock ticks (100 Hz).
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    return (Number(fields[11]) + Number(fields[12])) * 10;
  } catch {
    return NaN;
  }
}

/**
 * 50 connections for `seconds`; p95 from every response time (autocannon's table stops at p90 / p97.5).
 * `cpuPids` (the app and MariaDB) give CPU time per request, which the other work on a shared
 * machine disturbs less than latency.
 */
async function load(
  url: string,
  cookie: string,
  cpuPids: { app?: number; db?: number },
  seconds = 8,
): Promise<{ p50Ms: number; p95Ms: number; p99Ms: number; requests: number; errors: number; non2xx: number; rps: number; appCpuMsPerReq: number; dbCpuMsPerReq: number }> {
  const cpu0 = { app: cpuMs(cpuPids.app), db: cpuMs(cpuPids.db) };
  const times: number[] = [];
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ url, connections: 50, duration: seconds, headers: { cookie } }, (err, res) => (err ? reject(err) : resolve(res)));
    instance.on('response', (_client, _status, _bytes, responseTime) => times.push(responseTime));
  });
  const perReq = (pid: number | undefined, before: number) => Math.round(((cpuMs(pid) - before) / Math.max(1, result.requests.total)) * 1000) / 1000;
  const appCpuMsPerReq = perReq(cpuPids.app, cpu0.app);
  const dbCpuMsPerReq = perReq(cpuPids.db, cpu0.db);
  times.sort((a, b) => a - b);
  return {
    p50Ms: round(percentile(times, 50)),
    p95Ms: round(percentile(times, 95)),
    p99Ms: round(percentile(times, 99)),
    requests: result.requests.total,
    errors: result.errors + result.timeouts,
    non2xx: result.non2xx,
    rps: Math.round(result.requests.average),
    appCpuMsPerReq,
    dbCpuMsPerReq,
  };
}

/**
 * The app runs in a child process (the same code as `npm start` mounts), so that autocannon's
 * own work in this process does not share the app's event loop.
 */
async function serveChild(url: string): Promise<void> {
  const { db, pool } = createDb(url, { connectionLimit: 20 });
  const config = loadConfig({ NODE_ENV: 'production' }, { argon2: { memoryCost: 4096, timeCost: 1 } });
  const mailer: Mailer = { send: async () => ({ messageId: 'bench' }), close: async () => {} };
  const deps: AppDeps = { db, pool, config, mailer, storage: diskStorage(join(tmpdir(), 'wirewalk-api-bench-files')), outbox: false, demo: true };
  const http = createApp(deps).listen(0, '127.0.0.1', () => process.send?.({ port: (http.address() as AddressInfo).port }));
  process.on('disconnect', () => {
    http.closeAllConnections();
    http.close();
    // Let handlers still running finish before the pool goes.
    setTimeout(() => void pool.end().then(() => process.exit(0)), 1000);
  });
}

function startChild(url: string): Promise<{ base: string; pid?: number; stop: () => Promise<void> }> {
  return new Promise((resolve, reject) => {
    // API_BENCH_PROFILE=DIR writes a CPU profile of the app process there (node --cpu-prof).
    const profile = process.env.API_BENCH_PROFILE ? ['--cpu-prof', '--cpu-prof-dir', process.env.API_BENCH_PROFILE] : [];
    const child = fork(fileURLToPath(import.meta.url), [], { env: { ...process.env, WIREWALK_API_BENCH_SERVER: url }, execArgv: ['--import', 'tsx', ...profile], stdio: ['ignore', 'inherit', 'inherit', 'ipc'] });
    child.once('error', reject);
    child.once('exit', (code) => reject(new Error(`bench server exited with ${code}`)));
    child.once('message', (m) => {
      const port = (m as { port: number }).port;
      resolve({
        base: `http://127.0.0.1:${port}`,
        pid: child.pid,
        stop: () =>
          new Promise<void>((done) => {
            child.removeAllListeners('exit');
            child.once('exit', () => done());
            child.disconnect();
            setTimeout(() => child.kill(), 5000).unref();
          }),
      });
    });
  });
}

export async function run(): Promise<Result[]> {
  const dir = mkdtempSync(join(tmpdir(), 'wirewalk-api-bench-'));
  const mariadb = await startPrivateMariaDb({ dataDir: join(dir, 'db'), port: await freePort() });
  const { db, pool } = createDb(mariadb.url, { connectionLimit: 20 });
  const server = { close: async () => {} };
  try {
    await runMigrations(db);
    const config = loadConfig({ NODE_ENV: 'production' }, { argon2: { memoryCost: 4096, timeCost: 1 } });
    await seedShop({ db, config }, demoShop);
    const child = await startChild(mariadb.url);
    server.close = child.stop;
    const base = child.base;
    const cpuPids = { app: child.pid, db: mariadb.pid };

    const signIn = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'lead@example.com', password: DEMO_PASSWORD }) });
    if (signIn.status !== 200) throw new Error(`sign-in answered ${signIn.status}`);
    const cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
    const api = async (method: string, path: string, body?: string) => {
      const res = await fetch(`${base}${path}`, { method, headers: { cookie, 'content-type': 'application/json' }, body });
      // eslint-disable-next-line @typescript-eslint/no-explicit-any -- response bodies read loosely
      const json = (await res.json()) as Record<string, any>;
      if (!res.ok) throw new Error(`${method} ${path} answered ${res.status}: ${JSON.stringify(json).slice(0, 300)}`);
      return json;
    };

    const results: Result[] = [];

    // Import of 1000 circuits, end to end (HTTP, parse, validate, one transaction of batched inserts).
    const big = makeHarnessText(1000);
    // A running server has imported before: warm the validator and the insert path on a small document.
    await api('POST', '/api/harnesses/import', makeHarnessText(10));
    const t0 = performance.now();
    const imported = await api('POST', '/api/harnesses/import', big);
    const importMs = performance.now() - t0;
    const t1 = performance.now();
    const exported = await api('GET', `/api/revisions/${imported.revisionId}/export`);
    const exportMs = performance.now() - t1;
    const doc = JSON.parse(big);
    results.push({
      bench: 'api.import',
      circuits: 1000,
      components: doc.components.length,
      wires: doc.wires.length,
      bytes: big.length,
      ms: Math.round(importMs),
      exportMs: Math.round(exportMs),
      roundTrip: isDeepStrictEqual(exported, doc),
      targetMs: 10_000,
    });
    await api('POST', `/api/revisions/${imported.revisionId}/publish`, JSON.stringify({ note: 'bench' }));

    // A published 100-circuit harness: readings under load.
    const small = await api('POST', '/api/harnesses/import', makeHarnessText(100));
    await api('POST', `/api/revisions/${small.revisionId}/publish`, JSON.stringify({ note: 'bench' }));
    const readingsPath = `/api/revisions/${small.revisionId}/readings?state=key_on`;
    try {
      const first = await api('GET', readingsPath);
      const readings = await load(`${base}${readingsPath}`, cookie, cpuPids);
      results.push({ bench: 'api.readings', circuits: 100, pins: first.pins?.length ?? 0, connections: 50, ...readings, targetP95Ms: 50 });
    } catch (err) {
      results.push({ bench: 'api.readings', circuits: 100, error: (err as Error).message });
    }

    // A pin lookup by search across both harnesses.
    const searchPath = `/api/search?q=${encodeURIComponent('XA50.1')}`;
    const hits = await api('GET', searchPath);
    const search = await load(`${base}${searchPath}`, cookie, cpuPids);
    results.push({ bench: 'api.search', q: 'XA50.1', results: hits.results.length, connections: 50, ...search, targetP95Ms: 50 });
    return results;
  } finally {
    await server.close();
    await pool.end();
    await mariadb.stop();
    rmSync(dir, { recursive: true, force: true });
  }
}

if (process.env.WIREWALK_API_BENCH_SERVER) {
  await serveChild(process.env.WIREWALK_API_BENCH_SERVER);
} else if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  for (const r of await run()) console.log(JSON.stringify(r));
}
