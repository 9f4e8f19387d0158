import { spawn } from 'node:child_process';
import { existsSync, readdirSync, renameSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '..');

function newestMtime(target: string): number {
  if (!existsSync(target)) return 0;
  const stat = statSync(target);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of readdirSync(target, { withFileTypes: true })) {
    if (entry.name === 'node_modules' || entry.name.startsWith('.')) continue;
    newest = Math.max(newest, newestMtime(path.join(target, entry.name)));
  }
  return newest;
}

/** dist/index.html is missing or older than the client's sources. */
export function clientNeedsBuild(distDir: string): boolean {
  const index = path.join(distDir, 'index.html');
  if (!existsSync(index)) return true;
  const built = statSync(index).mtimeMs;
  const sources = ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'package-lock.json'].map((p) => newestMtime(path.join(root, p)));
  return Math.max(...sources) > built;
}

/**
 * `vite build` in a child process (the database work goes on meanwhile on another core),
 * into a scratch folder that then replaces `distDir`, so nobody serves a half-written build.
 */
export async function buildClient(log: (line: string) => void, distDir = path.join(root, 'dist')) {
  const started = Date.now();
  log('Building the client (dist/ is missing or older than src/)…');
  const scratch = path.join(root, 'node_modules', '.cache', `wirewalk-dist-${process.pid}`);
  rmSync(scratch, { recursive: true, force: true });
  const output: string[] = [];
  const code = await new Promise<number | null>((resolve, reject) => {
    const child = spawn(
      process.execPath,
      [path.join(root, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn', '--outDir', scratch, '--emptyOutDir'],
      { cwd: root, env: { ...process.env, NODE_ENV: 'production' }, stdio: ['ignore', 'pipe', 'pipe'] },
    );
    for (const stream of [child.stdout, child.stderr]) stream.on('data', (chunk: Buffer) => output.push(chunk.toString()));
    child.once('error', reject);
    child.once('exit', resolve);
  });
  if (code !== 0) {
    rmSync(scratch, { recursive: true, force: true });
    throw new Error(`The client build failed (exit ${code}):\n${output.join('').slice(-4000)}`);
  }
  const old = `${distDir}.old-${process.pid}`;
  if (existsSync(distDir)) renameSync(distDir, old);
  renameSync(scratch, distDir);
  rmSync(old, { recursive: true, force: true });
  log(`Client built in ${((Date.now() - started) / 1000).toFixed(1)} s.`);
}
