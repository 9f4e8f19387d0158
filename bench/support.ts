/** What several bench modules share: invented bus traffic written to disk, sizes in MB, the real app and chromium. */
import { spawn, type ChildProcess } from 'node:child_process';
import { createWriteStream, mkdtempSync, rmSync } from 'node:fs';
import { once } from 'node:events';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type Browser } from 'playwright-core';
import { freePort } from '../tests/support/ports';

const IDS = [
  ...Array.from({ length: 40 }, (_, i) => (0x0cf00000 + i * 0x10101).toString(16).toUpperCase().padStart(8, '0')),
  ...Array.from({ length: 20 }, (_, i) => (0x100 + i * 0x21).toString(16).toUpperCase().padStart(3, '0')),
];

const hex = (v: number) => (v & 0xff).toString(16).toUpperCase().padStart(2, '0');

/** Invented candump traffic of 60 identifiers; `moved` ramps byte 4 (1-based) of the first. */
async function writeCapture(path: string, lines: number, moved: boolean): Promise<void> {
  const out = createWriteStream(path);
  let buf: string[] = [];
  for (let i = 0; i < lines; i++) {
    const id = IDS[i % IDS.length];
    const t = (1700000000 + i * 0.0005).toFixed(6);
    const lever = moved && i % IDS.length === 0 ? (i >> 6) & 0xff : 0;
    buf.push(`(${t}) can0 ${id}#${hex(i)}${hex(i * 7)}5A${hex(lever)}00FFFF${hex(i >> 8)}`);
    if (buf.length === 10000) {
      if (!out.write(buf.join('\n') + '\n')) await once(out, 'drain');
      buf = [];
    }
  }
  if (buf.length) out.write(buf.join('\n') + '\n');
  out.end();
  await once(out, 'finish');
}

/** Bytes as megabytes, one decimal. */
export const mb = (n: number) => Math.round((n / 1048576) * 10) / 10;

/** The three captures both bus benches use: 1,000,000 lines, and 100,000 at rest and with the lever moved. */
export async function writeBenchCaptures(dir: string): Promise<{ big: string; rest: string; moved: string }> {
  const files = { big: join(dir, 'big.log'), rest: join(dir, 'rest.log'), moved: join(dir, 'moved.log') };
  await writeCapture(files.big, 1_000_000, false);
  await writeCapture(files.rest, 100_000, false);
  await writeCapture(files.moved, 100_000, true);
  return files;
}

/** The real app (server/index.ts, demo shop, production build) on free ports with its own data folder. */
export async function startApp(name: string): Promise<{ base: string; stop: () => Promise<void> }> {
  const [port, dbPort] = [await freePort(), await freePort()];
  const dataDir = mkdtempSync(join(tmpdir(), `wirewalk-${name}-bench-`));
  const base = `http://127.0.0.1:${port}`;
  const log: string[] = [];
  const app = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, PORT: String(port), DB_PORT: String(dbPort), DATA_DIR: dataDir, DEMO: '1', NODE_ENV: 'production', PUBLIC_URL: base, DATABASE_URL: '', SMTP_URL: '' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  for (const s of [app.stdout!, app.stderr!]) s.on('data', (c: Buffer) => log.push(c.toString()));
  const stop = async () => {
    const exited = new Promise((r) => app.once('exit', r));
    app.kill('SIGTERM');
    await Promise.race([exited, new Promise((r) => setTimeout(r, 15_000))]);
    if (app.exitCode === null) app.kill('SIGKILL');
    rmSync(dataDir, { recursive: true, force: true });
  };
  try {
    await waitForHealth(base, app, 240_000);
  } catch (e) {
    await stop();
    throw new Error(`${(e as Error).message}\n${log.join('').slice(-3000)}`);
  }
  return { base, stop };
}

async function waitForHealth(url: string, child: ChildProcess, ms: number) {
  const deadline = Date.now() + ms;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the app exited with ${child.exitCode}`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) return;
    } catch {
      /* not yet */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error('the app did not start');
}

/** Debian's chromium, headless; never a downloaded browser. */
export const launchChromium = (): Promise<Browser> =>
  chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run'] });

/** A demo account's session cookie, signed in through the API. */
export async function signInCookie(base: string, email: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: 'wirewalk-demo' }) });
  if (res.status !== 200) throw new Error(`sign-in answered ${res.status}: ${(await res.text()).slice(0, 200)}`);
  return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}
