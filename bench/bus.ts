/**
 * Bench: bus captures through the real routes, on loopback against a private MariaDB.
 * - bus.upload: POST /api/harnesses/:id/captures of a generated 1,000,000-line candump log
 *   (multipart, sent by curl from disk); the server writes and summarises it in one pass.
 *   Target ≤ 5 s; memory bounded: the peak heap rise stays far below the file's size.
 * - bus.compare: GET /api/captures/:rest/compare/:moved of two 100,000-line captures
 *   (the route loads both stored summaries and compares). Target ≤ 1 s.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { promisify } from 'node:util';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { createApp } from '../server/app';
import { loadConfig } from '../server/config';
import type { AppDeps } from '../server/deps';
import { createDb } from '../server/db/client';
import { freePort, startPrivateMariaDb } from '../server/db/mariadb';
import { runMigrations } from '../server/db/migrate';
import type { Mailer } from '../server/mail/mailer';
import { diskStorage } from '../server/storage';
import { DEMO_PASSWORD, demoShop, seedShop } from '../seeds/index';
import { harnessDocument } from '../seeds/library';
import { mb, writeBenchCaptures } from './support';

type Result = { bench: string; [k: string]: unknown };
const execFileAsync = promisify(execFile);

const ms = (n: number) => Math.round(n);

export async function run(): Promise<Result[]> {
  const dir = mkdtempSync(join(tmpdir(), 'wirewalk-bus-bench-'));
  const mariadb = await startPrivateMariaDb({ dataDir: join(dir, 'db'), port: await freePort() });
  const { db, pool } = createDb(mariadb.url, { connectionLimit: 10 });
  let http: import('node:http').Server | null = null;
  try {
    await runMigrations(db);
    const config = loadConfig({ NODE_ENV: 'production', DATA_DIR: join(dir, 'data') }, { argon2: { memoryCost: 4096, timeCost: 1 } });
    const mailer: Mailer = { send: async () => ({ messageId: 'bench' }), close: async () => {} };
    const deps: AppDeps = { db, pool, config, mailer, storage: diskStorage(join(dir, 'files')), outbox: false, demo: true };
    await seedShop(deps, demoShop);
    const app = createApp(deps);
    http = await new Promise((resolve) => {
      const s = app.listen(0, '127.0.0.1', () => resolve(s));
    });
    const base = `http://127.0.0.1:${(http!.address() as AddressInfo).port}`;
    const signIn = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'lead@example.com', password: DEMO_PASSWORD }) });
    if (signIn.status !== 200) throw new Error(`sign-in answered ${signIn.status}`);
    const cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
    const imp = await fetch(`${base}/api/harnesses/import`, { method: 'POST', headers: { cookie, 'content-type': 'application/json' }, body: JSON.stringify(harnessDocument('kr-t78-main')) });
    const { harnessId } = (await imp.json()) as { harnessId: string };

    /** The upload from another process (curl), so the client's work does not share the server's event loop. */
    const upload = async (path: string, name: string) => {
      const t = performance.now();
      const { stdout } = await execFileAsync('curl', ['-sS', '-w', '\n%{http_code}', '-H', `cookie: ${cookie}`, '-F', `name=${name}`, '-F', `file=@${path};type=text/plain`, `${base}/api/harnesses/${harnessId}/captures`], { maxBuffer: 64 * 1024 * 1024 });
      const ms = performance.now() - t;
      const nl = stdout.lastIndexOf('\n');
      const status = Number(stdout.slice(nl + 1));
      const body = JSON.parse(stdout.slice(0, nl)) as { capture: { id: string; lines: number; frames: number; badLineCount: number } };
      if (status !== 201) throw new Error(`upload answered ${status}: ${stdout.slice(0, 300)}`);
      return { ms, capture: body.capture };
    };

    const { big, rest, moved } = await writeBenchCaptures(dir);

    // Warm the route (JIT, the first multipart parse) on the small file.
    const r = await upload(rest, 'rest');
    const m = await upload(moved, 'moved');

    global.gc?.();
    const heapBefore = process.memoryUsage().heapUsed;
    let heapPeak = heapBefore;
    let rssPeak = process.memoryUsage().rss;
    const sampler = setInterval(() => {
      const u = process.memoryUsage();
      heapPeak = Math.max(heapPeak, u.heapUsed);
      rssPeak = Math.max(rssPeak, u.rss);
    }, 20);
    const bigUp = await upload(big, 'big');
    clearInterval(sampler);
    const bytes = statSync(big).size;

    const times: number[] = [];
    let changed = '';
    for (let i = 0; i < 5; i++) {
      const t = performance.now();
      const res = await fetch(`${base}/api/captures/${r.capture.id}/compare/${m.capture.id}`, { headers: { cookie } });
      const body = (await res.json()) as { comparison: { changedBytes: { key: string; position: number }[] } };
      times.push(performance.now() - t);
      changed = `${body.comparison.changedBytes[0]?.key} byte ${body.comparison.changedBytes[0]?.position}`;
    }
    times.sort((a, b) => a - b);
    return [
      {
        bench: 'bus.upload',
        lines: bigUp.capture.lines,
        frames: bigUp.capture.frames,
        fileMB: mb(bytes),
        ms: ms(bigUp.ms),
        targetMs: 5000,
        ok: bigUp.ms <= 5000 && bigUp.capture.lines === 1_000_000,
        heapRiseMB: mb(heapPeak - heapBefore),
        rssPeakMB: mb(rssPeak),
        boundedMemory: heapPeak - heapBefore < bytes / 2,
      },
      { bench: 'bus.compare', lines: [r.capture.lines, m.capture.lines], medianMs: ms(times[2]), maxMs: ms(times[4]), targetMs: 1000, ok: times[2] <= 1000, top: changed },
    ];
  } finally {
    if (http) await new Promise<void>((resolve) => { http!.close(() => resolve()); http!.closeAllConnections(); });
    await pool.end().catch(() => undefined);
    await mariadb.stop().catch(() => undefined);
    rmSync(dir, { recursive: true, force: true });
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  run().then((rs) => rs.forEach((x) => process.stdout.write(`${JSON.stringify(x)}\n`)), (err) => {
    console.error(err);
    process.exitCode = 1;
  });
}
