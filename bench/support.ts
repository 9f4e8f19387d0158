/** What several bench modules share: invented bus traffic written to disk, and sizes in MB. */
import { createWriteStream } from 'node:fs';
import { once } from 'node:events';
import { join } from 'node:path';

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
