/**
 * Bench: summarise a generated 1,000,000-line candump log streamed from a
 * temporary file in chunks (as the server reads an upload), and compare two
 * 100,000-line captures. Targets: ≤ 5 s and bounded memory; compare ≤ 1 s.
 */
import { createReadStream, mkdtempSync, rmSync, createWriteStream } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { once } from 'node:events';
import { CaptureSummariser, type CaptureSummary } from '../shared/can/candump';
import { compareCaptures } from '../shared/can/compare';

const IDS = [
  ...Array.from({ length: 40 }, (_, i) => (0x0cf00000 + i * 0x10101).toString(16).toUpperCase().padStart(8, '0')),
  ...Array.from({ length: 20 }, (_, i) => (0x100 + i * 0x21).toString(16).toUpperCase().padStart(3, '0')),
];

const hex = (v: number) => (v & 0xff).toString(16).toUpperCase().padStart(2, '0');

/** Invented traffic; `moved` ramps byte 4 of the first identifier. */
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

async function summariseFile(path: string, onChunk?: () => void): Promise<CaptureSummary> {
  const s = new CaptureSummariser();
  for await (const chunk of createReadStream(path, { encoding: 'utf8', highWaterMark: 1 << 20 })) {
    s.addChunk(chunk as string);
    onChunk?.();
  }
  return s.result();
}

const mb = (n: number) => Math.round((n / 1048576) * 10) / 10;

export async function run(): Promise<{ bench: string; [k: string]: unknown }[]> {
  const dir = mkdtempSync(join(tmpdir(), 'wirewalk-can-bench-'));
  try {
    const big = join(dir, 'big.log');
    const rest = join(dir, 'rest.log');
    const moved = join(dir, 'moved.log');
    await writeCapture(big, 1_000_000, false);
    await writeCapture(rest, 100_000, false);
    await writeCapture(moved, 100_000, true);

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
