/**
 * Bench: the harness drawing in headless chromium (Debian's), on the real app.
 * A 100-circuit harness (make_harness.py 100, about 830 components, no saved
 * positions) is imported, then opened as the demo lead:
 * - drawing.open: navigation to drawn and interactive (layout included), target ≤ 3000 ms
 * - drawing.layout: the full elkjs layout in the worker, target ≤ 2000 ms (workerMs: the
 *   layout itself; roundTripMs: from asking to positions back, waits for the worker's start and
 *   warm-up included; warmUpMs: the worker's warm-up runs on a small harness while the page loads)
 * - drawing.panzoom: the longest main-thread task (long-task observer) while
 *   panning and zooming, target ≤ 50 ms
 * Also: the sign-in page's scripts must not include the drawing (xyflow, elkjs).
 */
import { spawn, execFileSync, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium } from 'playwright-core';
import { freePort } from '../tests/support/ports';

type Result = { bench: string; [k: string]: unknown };

const harnessScript = () => process.env.MAKE_HARNESS ?? join(import.meta.dirname, '..', '..', 'shared', 'bench', 'make_harness.py');

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

export async function run(): Promise<Result[]> {
  const [port, dbPort] = [await freePort(), await freePort()];
  const dataDir = mkdtempSync(join(tmpdir(), 'wirewalk-drawing-bench-'));
  const base = `http://127.0.0.1:${port}`;
  const log: string[] = [];
  const app = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, PORT: String(port), DB_PORT: String(dbPort), DATA_DIR: dataDir, DEMO: '1', NODE_ENV: 'production', PUBLIC_URL: base, DATABASE_URL: '', SMTP_URL: '' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  for (const s of [app.stdout!, app.stderr!]) s.on('data', (c: Buffer) => log.push(c.toString()));
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run'],
  });
  try {
    await waitForHealth(base, app, 240_000).catch((e) => {
      throw new Error(`${(e as Error).message}\n${log.join('').slice(-3000)}`);
    });
    const signIn = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'lead@example.com', password: 'wirewalk-demo' }) });
    if (signIn.status !== 200) throw new Error(`sign-in answered ${signIn.status}: ${(await signIn.text()).slice(0, 200)}`);
    const cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
    const big = execFileSync('python3', [harnessScript(), '100'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
    const components = (JSON.parse(big) as { components: unknown[] }).components.length;
    const importRes = await fetch(`${base}/api/harnesses/import`, { method: 'POST', headers: { cookie, 'content-type': 'application/json' }, body: big });
    if (importRes.status !== 201) throw new Error(`import answered ${importRes.status}: ${(await importRes.text()).slice(0, 300)}`);
    const imported = (await importRes.json()) as { harnessId: string };

    const context = await browser.newContext({ baseURL: base, viewport: { width: 1366, height: 900 } });
    await context.addInitScript(() => {
      const w = window as unknown as { __longTasks: Array<{ start: number; duration: number }> };
      w.__longTasks = [];
      try {
        new PerformanceObserver((list) => {
          for (const e of list.getEntries()) w.__longTasks.push({ start: e.startTime, duration: e.duration });
        }).observe({ type: 'longtask', buffered: true });
      } catch {
        /* no long-task support */
      }
    });
    const page = await context.newPage();

    // Which scripts the sign-in page loads: the drawing must not be among them.
    const signInScripts: string[] = [];
    page.on('response', (r) => {
      if (r.url().endsWith('.js')) signInScripts.push(r.url());
    });
    await page.goto('/sign-in');
    await page.getByLabel(/e-?mail/i).fill('lead@example.com');
    await page.getByLabel(/password/i).fill('wirewalk-demo');
    await page.getByRole('button', { name: /sign in/i }).click();
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    const signInBytes = signInScripts.filter((u) => /xyflow|elk|DrawingPage|layout\.worker/i.test(u));
    page.removeAllListeners('response');

    // Open the drawing: wait until the layout is applied and the nodes are on screen.
    const t0 = Date.now();
    await page.goto(`/harnesses/${imported.harnessId}/drawing`);
    const consoleLines: string[] = [];
    page.on('console', (m) => consoleLines.push(m.text()));
    page.on('pageerror', (e) => consoleLines.push(String(e)));
    await page
      .waitForFunction(() => performance.getEntriesByName('ww-drawing-layout').length > 0 && document.querySelectorAll('.react-flow__node').length > 0, undefined, { timeout: 60_000, polling: 50 })
      .catch(async (e) => {
        await page.screenshot({ path: join('tests', 'artifacts', 'bench-drawing-failed.png') });
        const diag = await page.evaluate(() => ({
          marks: performance.getEntriesByName('ww-drawing-layout').length,
          nodes: document.querySelectorAll('.react-flow__node').length,
          edges: document.querySelectorAll('.react-flow__edge').length,
          viewport: document.querySelector('.react-flow__viewport')?.getAttribute('style'),
          pane: JSON.stringify(document.querySelector('.react-flow')?.getBoundingClientRect()),
          nodesHtml: document.querySelector('.react-flow__nodes')?.innerHTML.slice(0, 300) ?? 'no .react-flow__nodes',
          emptyNote: !!document.body.innerText.match(/An empty drawing/),
          progress: document.querySelector('[role=progressbar]')?.getAttribute('aria-label') ?? null,
          toasts: document.body.innerText.match(/layout[^\n]*/gi)?.slice(0, 3) ?? [],
        }));
        consoleLines.push(JSON.stringify(diag));
        throw new Error(`${(e as Error).message}\n${consoleLines.join('\n').slice(-2000)}`);
      });
    // Interactive: the main thread answers again (a frame and a task later).
    await page.evaluate(() => new Promise<void>((r) => requestAnimationFrame(() => setTimeout(r, 0))));
    const openMs = Date.now() - t0;
    await page.screenshot({ path: join('tests', 'artifacts', 'bench-drawing-open.png') }).catch(() => undefined);
    const layout = await page.evaluate(() => {
      const m = performance.getEntriesByName('ww-drawing-layout')[0] as PerformanceMeasure;
      return { roundTripMs: Math.round(m.duration), ...(m.detail as { workerMs: number; warmUpMs?: number | null; components: number }) };
    });
    const openLong = await page.evaluate(() => (window as unknown as { __longTasks: Array<{ duration: number }> }).__longTasks.map((t) => Math.round(t.duration)));

    // Pan and zoom, watching for long tasks.
    await page.waitForTimeout(500);
    const mark = await page.evaluate(() => performance.now());
    const box = (await page.locator('.react-flow__pane').boundingBox())!;
    const cx = box.x + box.width / 2;
    const cy = box.y + box.height / 2;
    for (let round = 0; round < 3; round++) {
      await page.mouse.move(cx, cy);
      await page.mouse.down();
      for (let i = 1; i <= 20; i++) await page.mouse.move(cx + i * 15, cy + i * 8);
      await page.mouse.up();
      for (let i = 0; i < 6; i++) {
        await page.mouse.wheel(0, -240);
        await page.waitForTimeout(30);
      }
      await page.mouse.move(cx, cy);
      await page.mouse.down();
      for (let i = 1; i <= 20; i++) await page.mouse.move(cx - i * 20, cy - i * 10);
      await page.mouse.up();
      for (let i = 0; i < 6; i++) {
        await page.mouse.wheel(0, 240);
        await page.waitForTimeout(30);
      }
    }
    await page.waitForTimeout(300);
    const panLong = await page.evaluate((since) => (window as unknown as { __longTasks: Array<{ start: number; duration: number }> }).__longTasks.filter((t) => t.start >= since).map((t) => Math.round(t.duration)), mark);
    await context.close();

    return [
      { bench: 'drawing.open', circuits: 100, components, ms: openMs, longTasksMs: openLong, targetMs: 3000 },
      { bench: 'drawing.layout', circuits: 100, components: layout.components, workerMs: layout.workerMs, roundTripMs: layout.roundTripMs, warmUpMs: layout.warmUpMs ?? null, targetMs: 2000 },
      { bench: 'drawing.panzoom', circuits: 100, longTasks: panLong.length, maxLongTaskMs: panLong.length ? Math.max(...panLong) : 0, targetMaxMs: 50 },
      { bench: 'drawing.bundle', signInScriptsWithDrawing: signInBytes.length, files: signInBytes.map((u) => u.split('/').pop()) },
    ];
  } finally {
    await browser.close();
    const exited = new Promise((r) => app.once('exit', r));
    app.kill('SIGTERM');
    await Promise.race([exited, new Promise((r) => setTimeout(r, 15_000))]);
    if (app.exitCode === null) app.kill('SIGKILL');
    rmSync(dataDir, { recursive: true, force: true });
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  for (const r of await run()) console.log(JSON.stringify(r));
}
