/**
 * Bench: summarise a generated 1,000,000-line candump log streamed from a
 * temporary file in chunks (as the server reads an upload), and compare two
 * 100,000-line captures. Targets: ≤ 5 s and bounded memory; compare ≤ 1 s.
 */
import { createReadStream, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { CaptureSummariser, type CaptureSummary } from '../shared/can/candump';
import { compareCaptures } from '../shared/can/compare';
import { mb, writeBenchCaptures } from './support';

async function summariseFile(path: string, onChunk?: () => void): Promise<CaptureSummary> {
  const s = new CaptureSummariser();
  for await (const chunk of createReadStream(path, { encoding: 'utf8', highWaterMark: 1 << 20 })) {
    s.addChunk(chunk as string);
    onChunk?.();
  }
  return s.result();
}

export async function run(): Promise<{ bench: string; [k: string]: unknown }[]> {
  const dir = mkdtempSync(join(tmpdir(), 'wirewalk-can-bench-'));
  try {
    const { big, rest, moved } = await writeBenchCaptures(dir);

    (globalThis as { gc?: () => void }).gc?.();
    const base = process.memoryUsage().heapUsed;
    let peak = base;
    const t0 = performance.now();
    const summary = await summariseFile(big, () => {
      const h = process.memoryUsage().heapUsed;
      if (h > peak) peak = h;
    });
    const ms = performance.now() - t0;

    const t1 = performance.now();
    const [a, b] = [await summariseFile(rest), await summariseFile(moved)];
    const t2 = performance.now();
    const cmp = compareCaptures(a, b);
    const t3 = performance.now();

    return [
      {
        bench: 'can.summarise',
        lines: summary.lines,
        identifiers: summary.identifiers.length,
        ms: Math.round(ms),
        heapMb: mb(peak),
        heapGrowthMb: mb(peak - base),
        targetMs: 5000,
      },
      {
        bench: 'can.compare',
        lines: a.lines + b.lines,
        ms: Math.round(t3 - t1),
        summariseMs: Math.round(t2 - t1),
        compareMs: Math.round((t3 - t2) * 10) / 10,
        changedBytes: cmp.changedBytes.length,
        top: cmp.changedBytes[0]?.sentence ?? null,
        targetMs: 1000,
      },
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  for (const r of await run()) console.log(JSON.stringify(r));
}
