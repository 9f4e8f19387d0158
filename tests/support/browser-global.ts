import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { freePort } from './ports';
import { scratchDir } from './scratch';

// The browser tests run the app the way a shop does: the real `npm start`
// entry point (private MariaDB, migrations, demo seed, built client), on free
// ports with a data folder of its own.
let app: ChildProcess | undefined;
let dataDir: string | undefined;

async function waitForHealth(url: string, child: ChildProcess, ms: number): Promise<void> {
  const deadline = Date.now() + ms;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the app exited with code ${child.exitCode} before it answered`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok && (await res.json()).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`the app did not answer ${url}/api/health within ${ms / 1000} s`);
}

export default async function setup(project: TestProject) {
  const [port, dbPort] = [await freePort(), await freePort()];
  dataDir = mkdtempSync(join(scratchDir(), 'wirewalk-browser-'));
  const baseUrl = `http://127.0.0.1:${port}`;
  const log: string[] = [];
  app = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, PORT: String(port), DB_PORT: String(dbPort), DATA_DIR: dataDir, DEMO: '1', NODE_ENV: 'production', PUBLIC_URL: baseUrl, DATABASE_URL: '', SMTP_URL: '' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  for (const stream of [app.stdout!, app.stderr!]) stream.on('data', (chunk: Buffer) => log.push(chunk.toString()));
  try {
    // A cold start builds the client and migrates a new database: minutes on a loaded machine.
    await waitForHealth(baseUrl, app, 300_000);
  } catch (error) {
    app.kill('SIGTERM');
    throw new Error(`${(error as Error).message}\n--- app output ---\n${log.join('').slice(-4000)}`);
  }
  project.provide('baseUrl', baseUrl);

  return async () => {
    if (app && app.exitCode === null) {
      const exited = new Promise((r) => app!.once('exit', r));
      app.kill('SIGTERM');
      let timer: NodeJS.Timeout | undefined;
      await Promise.race([exited, new Promise((r) => (timer = setTimeout(r, 15_000)))]);
      clearTimeout(timer);
      if (app.exitCode === null) app.kill('SIGKILL');
    }
    app?.stdout?.destroy();
    app?.stderr?.destroy();
    if (dataDir) rmSync(dataDir, { recursive: true, force: true });
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
  }
}
