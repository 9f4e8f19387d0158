// npm run dev: the private MariaDB once, the API restarted by `tsx watch` on every change,
// and the Vite dev server (which proxies /api to PORT).
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { loadConfig } from './config';
import { startPrivateMariaDb, type PrivateMariaDb } from './db/mariadb';

const root = path.resolve(import.meta.dirname, '..');

async function main() {
  const config = loadConfig();
  let mariadb: PrivateMariaDb | null = null;
  let url = config.databaseUrl;
  if (!url) {
    mariadb = await startPrivateMariaDb({ dataDir: path.join(config.dataDir, 'mariadb'), port: config.dbPort, log: console.log });
    url = mariadb.url;
  }
  const vitePort = process.env.VITE_PORT ?? '5173';
  // Vite's proxy rewrites Host to the API's, so the browser's Origin is the Vite server's.
  const viteOrigins = [`http://localhost:${vitePort}`, `http://127.0.0.1:${vitePort}`];
  const allowedOrigins = [process.env.ALLOWED_ORIGINS, ...viteOrigins].filter(Boolean).join(',');
  const env = { ...process.env, DATABASE_URL: url, WIREWALK_DEV: '1', ALLOWED_ORIGINS: allowedOrigins };
  const children: ChildProcess[] = [
    spawn(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), 'watch', '--clear-screen=false', path.join(root, 'server/index.ts')], { env, stdio: 'inherit', cwd: root }),
    spawn(process.execPath, [path.join(root, 'node_modules/vite/bin/vite.js')], { env: { ...process.env, PORT: String(config.port) }, stdio: 'inherit', cwd: root }),
  ];
  console.log(`Dev: API on http://127.0.0.1:${config.port}, client on http://localhost:${vitePort} (proxying /api).`);

  let stopping = false;
  const stop = async (code: number) => {
    if (stopping) return;
    stopping = true;
    await Promise.all(
      children.map(
        (child) =>
          new Promise<void>((resolve) => {
            if (child.exitCode !== null || child.signalCode !== null) return resolve();
            child.once('exit', () => resolve());
            child.kill('SIGTERM');
            setTimeout(() => child.kill('SIGKILL'), 10_000).unref();
          }),
      ),
    );
    await mariadb?.stop();
    process.exit(code);
  };
  for (const child of children) child.once('exit', (code) => void stop(code ?? 1));
  process.on('SIGINT', () => void stop(0));
  process.on('SIGTERM', () => void stop(0));
}

main().catch((err: Error) => {
  console.error(`Dev server could not start: ${err.message}`);
  process.exit(1);
});
