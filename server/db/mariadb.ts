import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import mysql from 'mysql2/promise';

/**
 * A private MariaDB server for one data folder: initialised on first use, started on
 * 127.0.0.1:<port> with its own socket and pid file, stopped by `stop()`.
 * It never connects to a server someone else started: the port must be free.
 */
export interface PrivateMariaDb {
  /** mysql://root@127.0.0.1:<port>/<database> */
  url: string;
  /** mysql://root@127.0.0.1:<port>/ (no database) */
  rootUrl: string;
  port: number;
  /** The server's process id (the API bench reads its CPU time). */
  pid?: number;
  stop(): Promise<void>;
}

export interface StartOptions {
  dataDir: string;
  port: number;
  /** The database to create (default `wirewalk`); null creates none. */
  database?: string | null;
  log?: (line: string) => void;
  /** Give up waiting for the server after this long (default 60 s). */
  timeoutMs?: number;
}

/** Given to both mariadb-install-db and mariadbd, so the redo log is made once at its final size. */
const INNODB_ARGS = ['--innodb-log-file-size=16M', '--innodb-buffer-pool-size=64M'];

const isRoot = () => typeof process.getuid === 'function' && process.getuid() === 0;
const INSTALL_COMMAND = 'apt-get update && apt-get install -y mariadb-server';

function findBinary(name: string): string | null {
  for (const dir of ['/usr/sbin', '/usr/bin', '/usr/local/sbin', '/usr/local/bin', ...(process.env.PATH ?? '').split(':')]) {
    if (dir && existsSync(path.join(dir, name))) return path.join(dir, name);
  }
  return null;
}

/** mariadbd and mariadb-install-db, installing Debian's mariadb-server first if root and missing. */
export function ensureMariaDbInstalled(log: (line: string) => void = () => {}): { mariadbd: string; installDb: string } {
  let mariadbd = findBinary('mariadbd');
  let installDb = findBinary('mariadb-install-db');
  if (!mariadbd || !installDb) {
    if (!isRoot()) {
      throw new Error(`MariaDB is not installed (no mariadbd found). Install it with:\n  sudo sh -c '${INSTALL_COMMAND}'\nor set DATABASE_URL to use an existing server.`);
    }
    log(`MariaDB is not installed; running: ${INSTALL_COMMAND}`);
    const result = spawnSync('sh', ['-c', INSTALL_COMMAND], {
      stdio: 'inherit',
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    });
    mariadbd = findBinary('mariadbd');
    installDb = findBinary('mariadb-install-db');
    if (result.status !== 0 || !mariadbd || !installDb) {
      throw new Error(`Installing MariaDB failed. Run this yourself, then start again:\n  ${INSTALL_COMMAND}`);
    }
  }
  return { mariadbd, installDb };
}

/** true when nothing listens on 127.0.0.1:port. */
export function isPortFree(port: number, host = '127.0.0.1'): Promise<boolean> {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.once('error', () => resolve(false));
    server.listen({ port, host, exclusive: true }, () => server.close(() => resolve(true)));
  });
}

/** A port the OS says is free right now. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen({ port: 0, host: '127.0.0.1' }, () => {
      const address = server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      server.close(() => resolve(port));
    });
  });
}

function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function waitForExit(pid: number, timeoutMs: number): Promise<boolean> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (!processAlive(pid)) return true;
    await sleep(100);
  }
  return !processAlive(pid);
}

/**
 * A pid file left by an earlier run: if its process is gone, remove pid and socket; if it is
 * still a mariadbd on this very data folder (an orphan of a crashed run of ours), stop it.
 */
async function clearStale(dataDir: string, pidFile: string, socket: string, log: (line: string) => void) {
  if (existsSync(pidFile)) {
    const pid = Number(readFileSync(pidFile, 'utf8').trim());
    if (Number.isInteger(pid) && pid > 0 && processAlive(pid)) {
      let cmdline = '';
      try {
        cmdline = readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0').join(' ');
      } catch {
        /* not Linux or not readable */
      }
      if (cmdline.includes('mariadbd') && cmdline.includes(`--datadir=${dataDir}`)) {
        log(`Stopping the MariaDB server left running on ${dataDir} by an earlier run (pid ${pid}).`);
        process.kill(pid, 'SIGTERM');
        if (!(await waitForExit(pid, 30_000))) throw new Error(`The earlier MariaDB server (pid ${pid}) on ${dataDir} did not stop; stop it and start again.`);
      } else {
        throw new Error(`${pidFile} names process ${pid}, which is running and is not our MariaDB server. Remove the file if that is wrong.`);
      }
    }
    rmSync(pidFile, { force: true });
  }
  rmSync(socket, { force: true });
}

function initialised(dataDir: string): boolean {
  return existsSync(path.join(dataDir, 'mysql', 'global_priv.frm')) || existsSync(path.join(dataDir, 'mysql', 'global_priv.MAI'));
}

export async function startPrivateMariaDb(options: StartOptions): Promise<PrivateMariaDb> {
  const log = options.log ?? (() => {});
  const dataDir = path.resolve(options.dataDir);
  const port = options.port;
  const database = options.database === undefined ? 'wirewalk' : options.database;
  const timeoutMs = options.timeoutMs ?? 60_000;
  const socket = path.join(dataDir, 'mysqld.sock');
  const pidFile = path.join(dataDir, 'mysqld.pid');
  const errorLog = path.join(dataDir, 'mariadbd.err');
  const { mariadbd, installDb } = ensureMariaDbInstalled(log);
  const root = isRoot();

  mkdirSync(dataDir, { recursive: true });
  await clearStale(dataDir, pidFile, socket, log);

  if (!initialised(dataDir)) {
    if (existsSync(path.join(dataDir, 'mysql'))) {
      // A half-finished initialisation from an interrupted run: start over (nothing of ours is in it yet).
      const entries = readdirSync(dataDir);
      log(`Re-initialising the incomplete MariaDB data folder ${dataDir} (${entries.length} entries).`);
      for (const entry of entries) rmSync(path.join(dataDir, entry), { recursive: true, force: true });
    }
    log(`Initialising a MariaDB data folder in ${dataDir}`);
    const args = ['--no-defaults', `--datadir=${dataDir}`, '--auth-root-authentication-method=normal', '--skip-test-db', ...INNODB_ARGS];
    if (root) args.push('--user=root');
    const result = spawnSync(installDb, args, { encoding: 'utf8' });
    if (result.status !== 0) {
      throw new Error(`mariadb-install-db failed (exit ${result.status}):\n${(result.stderr || result.stdout || '').slice(-2000)}`);
    }
  }

  if (!(await isPortFree(port))) {
    throw new Error(`Port ${port} on 127.0.0.1 is already in use, so the private MariaDB cannot start there. Set DB_PORT to a free port (or DATABASE_URL to use an existing server).`);
  }

  const args = [
    '--no-defaults',
    `--datadir=${dataDir}`,
    `--socket=${socket}`,
    `--pid-file=${pidFile}`,
    `--port=${port}`,
    '--bind-address=127.0.0.1',
    `--log-error=${errorLog}`,
    '--character-set-server=utf8mb4',
    '--collation-server=utf8mb4_unicode_ci',
    ...INNODB_ARGS,
    '--max-connections=300',
    '--skip-name-resolve',
  ];
  if (root) args.push('--user=root');
  log(`Starting MariaDB on 127.0.0.1:${port} (data in ${dataDir})`);
  const child: ChildProcess = spawn(mariadbd, args, { stdio: 'ignore' });
  let exited: { code: number | null; signal: NodeJS.Signals | null } | null = null;
  const exitPromise = new Promise<void>((resolve) => {
    child.once('exit', (code, signal) => {
      exited = { code, signal };
      resolve();
    });
  });
  const errorTail = () => {
    try {
      return readFileSync(errorLog, 'utf8').split('\n').slice(-15).join('\n');
    } catch {
      return '(no error log)';
    }
  };

  const rootUrl = `mysql://root@127.0.0.1:${port}/`;
  const until = Date.now() + timeoutMs;
  for (;;) {
    if (exited) throw new Error(`mariadbd exited while starting (${JSON.stringify(exited)}). Its log ${errorLog} ends:\n${errorTail()}`);
    try {
      const conn = await mysql.createConnection({ host: '127.0.0.1', port, user: 'root', connectTimeout: 1000 });
      try {
        if (database) await conn.query(`CREATE DATABASE IF NOT EXISTS \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
      } finally {
        await conn.end();
      }
      break;
    } catch (err) {
      if (Date.now() > until) {
        child.kill('SIGTERM');
        throw new Error(`MariaDB did not answer on 127.0.0.1:${port} within ${timeoutMs} ms (${(err as Error).message}). Its log ends:\n${errorTail()}`);
      }
      await sleep(100);
    }
  }

  let stopping: Promise<void> | null = null;
  return {
    url: `${rootUrl}${database ?? ''}`,
    rootUrl,
    port,
    pid: child.pid,
    stop() {
      stopping ??= (async () => {
        if (exited) return;
        child.kill('SIGTERM');
        const timer = setTimeout(() => child.kill('SIGKILL'), 30_000);
        await exitPromise;
        clearTimeout(timer);
        log('MariaDB stopped.');
      })();
      return stopping;
    },
  };
}
