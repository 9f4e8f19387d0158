/**
 * Bench: the harness drawing in headless chromium (Debian's), on the real app.
 * A 100-circuit harness (make_harness.py 100, about 830 components, no positions in the file) is
 * imported (the server lays it out on import: importMs), then opened as the demo lead:
 * - drawing.open: navigation to drawn and interactive, target ≤ 3000 ms. unplacedMs: the same for
 *   a draft stored without positions (too big to lay out on import), laid out in the browser on
 *   opening (unplacedLayout: that layout's figures, as below), opened last with the scripts cached
 * - drawing.layout: a full elkjs layout in the browser's worker ("Tidy all" on the open drawing),
 *   target ≤ 2000 ms (workerMs: the layout itself; roundTripMs: from asking to positions back;
 *   warmUp: the worker's warm-up runs (their time in the worker, how many), which the page sends one
 *   at a time while the lead pauses; warmUpWaitMs: how long after the panning the bench waited for
 *   the last of them)
 * - drawing.panzoom: the longest main-thread task (long-task observer) while
 *   panning and zooming, target ≤ 50 ms; per level (fit-view, mid zoom 0.35 with hundreds of
 *   nodes in view, working zoom 0.8): the zoom reached, nodes drawn (or whether the overview
 *   picture stands in for them) and the longest task while panning there; zoomMaxMs while zooming between them by the wheel;
 *   longTasksDuringWarmUpMs, those of the long tasks that overlapped a warm-up run of the layout worker; pageScrollPx, how far the
 *   page itself scrolled (it must stay 0, or the figures are not of the drawing)
 * Also: the sign-in page's scripts must not include the drawing (xyflow, elkjs).
 */
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Browser, Page } from 'playwright-core';
import { makeHarnessText } from '../tests/support/make-harness';
import { launchChromium, signInCookie, startApp } from './support';

type Result = { bench: string; [k: string]: unknown };

/**
 * The zoom levels panned at: the whole drawing (fit-view), mid zoom with hundreds of nodes in view,
 * compact (below the drawing's COMPACT_ZOOM, captions hidden) and working zoom (every label readable).
 */
const LEVELS = [
  { name: 'fit', zoom: null },
  { name: 'mid', zoom: 0.15 },
  { name: 'compact', zoom: 0.4 },
  { name: 'working', zoom: 0.8 },
] as const;

const zoomOf = (page: Page) =>
  page.evaluate(() => Number(/scale\(([\d.e-]+)\)/.exec(document.querySelector<HTMLElement>('.react-flow__viewport')?.style.transform ?? '')?.[1] ?? NaN));

const nextFrame = (page: Page) => page.evaluate(() => new Promise<void>((r) => requestAnimationFrame(() => r())));

/** Long tasks since `since` (performance.now()), in whole ms. */
const longTasksSince = (page: Page, since: number) =>
  page.evaluate((t0) => (window as unknown as { __longTasks: Array<{ start: number; duration: number }> }).__longTasks.filter((t) => t.start >= t0).map((t) => Math.round(t.duration)), since);

/** Wheel steps at the pane's centre (one a frame, as a mouse wheel sends them) until the zoom passes `target`. */
async function wheelTo(page: Page, cx: number, cy: number, target: number): Promise<number> {
  await page.mouse.move(cx, cy);
  let z = await zoomOf(page);
  for (let i = 0; i < 80 && (target > z ? z < target : z > target); i++) {
    await page.mouse.wheel(0, target > z ? -100 : 100);
    await nextFrame(page);
    z = await zoomOf(page);
  }
  return z;
}

interface TraceEvent {
  name: string;
  ph: string;
  ts: number;
  dur?: number;
  tid: number;
  args?: { name?: string; data?: { functionName?: string } };
}

/** DRAWING_BENCH_TRACE=1: where the main thread's time went while panning, by trace event (nested events count in their parents too). */
function traceSummary(trace: Buffer): string {
  const events = (JSON.parse(trace.toString()) as { traceEvents: TraceEvent[] }).traceEvents;
  const main = events.find((e) => e.name === 'thread_name' && e.args?.name === 'CrRendererMain')?.tid;
  const total = new Map<string, number>();
  for (const e of events) if (e.tid === main && e.ph === 'X' && e.dur) total.set(e.name, (total.get(e.name) ?? 0) + e.dur / 1000);
  const summary = [...total].sort((a, b) => b[1] - a[1]).slice(0, 14).map(([n, ms]) => `${n} ${Math.round(ms)}`).join(', ');
  // Each task over 50 ms, with the longest events inside it (by their own time, not their children's).
  const x = events.filter((e): e is TraceEvent & { dur: number } => e.tid === main && e.ph === 'X' && !!e.dur);
  const big = x.filter((e) => e.dur > 45_000);
  const long = big.filter((e) => !big.some((o) => o !== e && o.ts <= e.ts && o.ts + o.dur >= e.ts + e.dur && o.dur > e.dur));
  const inside = long.map((t) => {
    const within = x.filter((e) => e !== t && e.ts >= t.ts && e.ts + e.dur <= t.ts + t.dur);
    const own = within.map((e) => ({ e, self: e.dur - within.filter((c) => c !== e && c.ts >= e.ts && c.ts + c.dur <= e.ts + e.dur && c.dur < e.dur).reduce((s, c) => s + c.dur, 0) }));
    const top = own.sort((a, b) => b.self - a.self).slice(0, 6).map(({ e, self }) => `${e.name}${e.args?.data?.functionName ? `(${e.args.data.functionName})` : ''} ${Math.round(self / 1000)}`);
    return `\n  task ${t.name} ${Math.round(t.dur / 1000)} ms: ${top.join(', ')}`;
  });
  return summary + inside.join('');
}

/** Drags the pane around a loop, one mouse move a frame. */
async function panLoop(page: Page, cx: number, cy: number) {
  for (const [dx, dy] of [[12, 6], [-12, 6], [-12, -6], [12, -6]]) {
    await page.mouse.move(cx, cy);
    await page.mouse.down();
    for (let i = 1; i <= 20; i++) {
      await page.mouse.move(cx + i * dx, cy + i * dy);
      await nextFrame(page);
    }
    await page.mouse.up();
  }
}

export async function run(): Promise<Result[]> {
  const { base, stop } = await startApp('drawing');
  let browser: Browser | undefined;
  try {
    browser = await launchChromium();
    const cookie = await signInCookie(base, 'lead@example.com');
    const big = makeHarnessText(100);
    const components = (JSON.parse(big) as { components: unknown[] }).components.length;
    const importDoc = async () => {
      const importRes = await fetch(`${base}/api/harnesses/import`, { method: 'POST', headers: { cookie, 'content-type': 'application/json' }, body: big });
      if (importRes.status !== 201) throw new Error(`import answered ${importRes.status}: ${(await importRes.text()).slice(0, 300)}`);
      return (await importRes.json()) as { harnessId: string; revisionId: string };
    };
    const importStarted = Date.now();
    const imported = await importDoc();
    const importMs = Date.now() - importStarted;
    const placed = (await (await fetch(`${base}/api/revisions/${imported.revisionId}`, { headers: { cookie } })).json()) as { positions: Record<string, unknown> };
    if (Object.keys(placed.positions).length !== components) throw new Error(`the import placed ${Object.keys(placed.positions).length} of ${components} components`);
    // The same harness stored without positions, as one too big to lay out on import would be.
    const unplaced = await importDoc();
    const cleared = await fetch(`${base}/api/revisions/${unplaced.revisionId}/document`, {
      method: 'PUT',
      headers: { cookie, 'content-type': 'application/json' },
      body: `{"version":1,"positions":{},"document":${big}}`,
    });
    if (!cleared.ok) throw new Error(`clearing positions answered ${cleared.status}`);

    const context = await browser.newContext({ baseURL: base, viewport: { width: 1366, height: 900 } });
    await context.addInitScript(() => {
      const w = window as unknown as { __longTasks: Array<{ start: number; duration: number }> };
      w.__longTasks = [];
      addEventListener('scroll', () => {
        (window as unknown as { __maxScroll: number }).__maxScroll = Math.max((window as unknown as { __maxScroll?: number }).__maxScroll ?? 0, scrollY);
      });
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

    // Open the drawing: wait until it is drawn (laid out first when it has no positions) and answers.
    const consoleLines: string[] = [];
    page.on('console', (m) => consoleLines.push(m.text()));
    page.on('pageerror', (e) => consoleLines.push(String(e)));
    const openDrawing = async (harnessId: string, laidOutHere: boolean) => {
      const t0 = Date.now();
      await page.goto(`/harnesses/${harnessId}/drawing`);
      await page
        .waitForFunction(
          (needLayout) =>
            (!needLayout || performance.getEntriesByName('ww-drawing-layout').length > 0) &&
            document.querySelectorAll('.react-flow__node').length > 0 &&
            !document.querySelector('[role=progressbar]'),
          laidOutHere,
          { timeout: 60_000, polling: 50 },
        )
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
      return Date.now() - t0;
    };
    /** The latest layout's figures (the page's own measure of it). */
    const lastLayout = () =>
      page.evaluate(() => {
        const all = performance.getEntriesByName('ww-drawing-layout');
        const m = all[all.length - 1] as PerformanceMeasure;
        return { roundTripMs: Math.round(m.duration), ...(m.detail as { workerMs: number; warmUpMs?: number | null; components: number }) };
      });

    const openMs = await openDrawing(imported.harnessId, false);
    await page.screenshot({ path: join('tests', 'artifacts', 'bench-drawing-open.png') }).catch(() => undefined);
    const openLong = await page.evaluate(() => (window as unknown as { __longTasks: Array<{ duration: number }> }).__longTasks.map((t) => Math.round(t.duration)));

    // Pan at each zoom level, and zoom across the range, watching for long tasks. The page itself must
    // not scroll: a scrolled page eats wheel steps and moves the pane under the mouse.
    await page.waitForTimeout(500);
    const box = (await page.locator('.react-flow__pane').boundingBox())!;
    const cx = box.x + box.width / 2;
    const cy = box.y + box.height / 2;
    const levels: Record<string, { zoom: number; nodesDrawn: number; overview: boolean; longTasks: number[] }> = {};
    const zoomLong: number[] = [];
    let fitZoom = NaN;
    let [ax, ay] = [cx, cy];
    for (let round = 0; round < 2; round++) {
      for (const level of LEVELS) {
        let since = await page.evaluate(() => performance.now());
        if (level.zoom === null) {
          await page.locator('.react-flow__controls-fitview').click();
          await page.waitForTimeout(400);
          fitZoom = await zoomOf(page);
          // Zoom in where the drawing is fullest (the median of the nodes' centres), so that mid zoom has
          // hundreds of nodes in view rather than the blank between columns.
          // With the overview picture drawn instead of the nodes, where its ink is (each inked pixel a point).
          [ax, ay] = await page.evaluate(() => {
            let points = [...document.querySelectorAll('.react-flow__node')].map((n) => n.getBoundingClientRect()).map((b) => [b.x + b.width / 2, b.y + b.height / 2]);
            const img = document.querySelector<HTMLImageElement>('[data-overview] img');
            if (!points.length && img) {
              const r = img.getBoundingClientRect();
              const canvas = document.createElement('canvas');
              [canvas.width, canvas.height] = [Math.max(1, Math.round(r.width)), Math.max(1, Math.round(r.height))];
              const g = canvas.getContext('2d')!;
              g.drawImage(img, 0, 0, canvas.width, canvas.height);
              const px = g.getImageData(0, 0, canvas.width, canvas.height).data;
              points = [];
              for (let i = 0; i < px.length; i += 4) if (px[i + 3] > 128 && px[i] + px[i + 1] + px[i + 2] < 600) points.push([r.left + ((i / 4) % canvas.width), r.top + Math.floor(i / 4 / canvas.width)]);
            }
            const xs = points.map((p) => p[0]).sort((a, b) => a - b);
            const ys = points.map((p) => p[1]).sort((a, b) => a - b);
            return [xs[xs.length >> 1] ?? 0, ys[ys.length >> 1] ?? 0];
          });
        } else {
          if (process.env.DRAWING_BENCH_TRACE) await browser.startTracing(page, { categories: ['toplevel', 'devtools.timeline', 'blink', 'cc', 'v8'] });
          await wheelTo(page, ax, ay, level.zoom);
          await page.waitForTimeout(300);
          if (process.env.DRAWING_BENCH_TRACE) process.stderr.write(`zooming to ${level.name}: ${traceSummary(await browser.stopTracing())}\n`);
        }
        await page.waitForTimeout(300);
        const toLevel = await longTasksSince(page, since);
        if (process.env.DRAWING_BENCH_TRACE) process.stderr.write(`zoom to ${level.name}: long tasks ${JSON.stringify(toLevel)}\n`);
        zoomLong.push(...toLevel);
        since = await page.evaluate(() => performance.now());
        if (process.env.DRAWING_BENCH_TRACE) await browser.startTracing(page, { categories: ['devtools.timeline', 'blink', 'cc'] });
        await panLoop(page, cx, cy);
        if (process.env.DRAWING_BENCH_TRACE) process.stderr.write(`${level.name} (zoom ${(await zoomOf(page)).toFixed(3)}): ${traceSummary(await browser.stopTracing())}\n`);
        await page.waitForTimeout(300);
        const l = (levels[level.name] ??= { zoom: 0, nodesDrawn: 0, overview: false, longTasks: [] });
        l.overview = await page.locator('[data-overview]').isVisible();
        l.zoom = Math.round((await zoomOf(page)) * 1000) / 1000;
        // Shown, that is: under the overview picture the nodes kept from before are in the page, hidden.
        l.nodesDrawn = Math.max(l.nodesDrawn, await page.evaluate(() => [...document.querySelectorAll('.react-flow__node')].filter((n) => getComputedStyle(n).visibility !== 'hidden').length));
        l.longTasks.push(...(await longTasksSince(page, since)));
        await page.screenshot({ path: join('tests', 'artifacts', `bench-drawing-${level.name}.png`) }).catch(() => undefined);
      }
      // From working zoom out to the whole drawing by the wheel.
      const since = await page.evaluate(() => performance.now());
      await wheelTo(page, cx, cy, fitZoom);
      await page.waitForTimeout(300);
      const out = await longTasksSince(page, since);
      if (process.env.DRAWING_BENCH_TRACE) process.stderr.write(`wheel out to fit: long tasks ${JSON.stringify(out)}\n`);
      zoomLong.push(...out);
    }
    if (process.env.DRAWING_BENCH_TRACE) {
      const builds = await page.evaluate(() => performance.getEntriesByName('ww-overview-build').map((m) => [Math.round(m.startTime), Math.round(m.duration)]));
      process.stderr.write(`overview pictures built (at, ms): ${JSON.stringify(builds)}\n`);
    }
    // Long tasks while a warm-up run of the layout worker held a core (the page sends those only after a pause).
    const duringWarmUp = await page.evaluate(() => {
      const runs = performance.getEntriesByName('ww-layout-warm-step').map((m) => [m.startTime, m.startTime + m.duration]);
      const tasks = (window as unknown as { __longTasks: Array<{ start: number; duration: number }> }).__longTasks;
      return tasks.filter((t) => runs.some(([a, b]) => t.start < b && t.start + t.duration > a)).map((t) => Math.round(t.duration));
    });
    const pageScrollPx = await page.evaluate(() => (window as unknown as { __maxScroll?: number }).__maxScroll ?? 0);

    // A full layout of the open drawing, as the lead asks for one with nothing selected, after a pause
    // in which the page warms its layout worker up on this drawing (it waits for the lead to pause).
    await page.keyboard.press('Escape');
    const warmUpWaitStarted = Date.now();
    await page.waitForFunction(() => performance.getEntriesByName('ww-layout-warm-up').length > 0, undefined, { timeout: 60_000, polling: 100 });
    const warmUpWaitMs = Date.now() - warmUpWaitStarted;
    const warmUp = await page.evaluate(() => (performance.getEntriesByName('ww-layout-warm-up')[0] as PerformanceMeasure).detail as { workerMs: number | null; runs: number | null });
    const layoutsBefore = await page.evaluate(() => performance.getEntriesByName('ww-drawing-layout').length);
    await page.getByRole('button', { name: 'Tidy all' }).first().click();
    await page.waitForFunction((n) => performance.getEntriesByName('ww-drawing-layout').length > n, layoutsBefore, { timeout: 60_000, polling: 50 });
    const layout = await lastLayout();
    // Last, so its scripts come from the cache as the first open's could not.
    const unplacedMs = await openDrawing(unplaced.harnessId, true);
    const unplacedLayout = await lastLayout();
    await context.close();

    const max = (xs: number[]) => (xs.length ? Math.max(...xs) : 0);
    const all = [...zoomLong, ...Object.values(levels).flatMap((l) => l.longTasks)];
    const perLevel = Object.fromEntries(
      Object.entries(levels).flatMap(([name, l]) => [
        [`${name}Zoom`, l.zoom],
        [`${name}NodesDrawn`, l.nodesDrawn],
        [`${name}Overview`, l.overview],
        [`${name}PanMaxMs`, max(l.longTasks)],
        [`${name}PanLongTasks`, l.longTasks.length],
      ]),
    );

    return [
      { bench: 'drawing.open', circuits: 100, components, ms: openMs, longTasksMs: openLong, importMs, unplacedMs, unplacedLayout, targetMs: 3000 },
      { bench: 'drawing.layout', circuits: 100, components: layout.components, workerMs: layout.workerMs, roundTripMs: layout.roundTripMs, warmUp, warmUpWaitMs, targetMs: 2000 },
      { bench: 'drawing.panzoom', circuits: 100, longTasks: all.length, maxLongTaskMs: max(all), targetMaxMs: 50, ...perLevel, zoomMaxMs: max(zoomLong), zoomLongTasks: zoomLong.length, longTasksDuringWarmUpMs: duringWarmUp, pageScrollPx },
      { bench: 'drawing.bundle', signInScriptsWithDrawing: signInBytes.length, files: signInBytes.map((u) => u.split('/').pop()) },
    ];
  } finally {
    await browser?.close();
    await stop();
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  for (const r of await run()) console.log(JSON.stringify(r));
}
