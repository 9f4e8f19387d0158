/**
 * npm run bench: runs every bench module listed here in turn, prints
 * progress on stderr and ends with one JSON line per benchmark on stdout.
 * A module exports `async function run(): Promise<BenchResult[]>`; add it
 * to the list with one line. `npm run bench -- engine can` runs only those.
 */
export type BenchResult = { bench: string; [k: string]: unknown };

const modules: Record<string, () => Promise<{ run: () => Promise<BenchResult[]> }>> = {
  engine: () => import('./engine'),
  can: () => import('./can'),
  drawing: () => import('./drawing'),
  pincard: () => import('./pincard'),
  api: () => import('./api'),
  bus: () => import('./bus'),
};

async function main(): Promise<void> {
  const only = process.argv.slice(2).filter((a) => !a.startsWith('-'));
  const names = only.length ? only.filter((n) => n in modules) : Object.keys(modules);
  const results: BenchResult[] = [];
  let failed = false;
  for (const name of names) {
    process.stderr.write(`bench ${name}…\n`);
    const t = performance.now();
    try {
      const mod = await modules[name]();
      const rs = await mod.run();
      results.push(...rs);
      process.stderr.write(`bench ${name}: ${rs.length} result(s) in ${((performance.now() - t) / 1000).toFixed(1)} s\n`);
    } catch (err) {
      failed = true;
      process.stderr.write(`bench ${name} failed: ${err instanceof Error ? err.stack ?? err.message : String(err)}\n`);
      results.push({ bench: `${name}.error`, error: err instanceof Error ? err.message : String(err) });
    }
  }
  for (const r of results) process.stdout.write(`${JSON.stringify(r)}\n`);
  if (failed) process.exitCode = 1;
}

void main();
