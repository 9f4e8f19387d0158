import { mkdirSync, mkdtempSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { afterAll, describe, expect, it } from 'vitest';
import { freePort, isPortFree, startPrivateMariaDb } from '../../server/db/mariadb';

// The private server lifecycle that npm start and the test setup use.
const dirs: string[] = [];
const tempDir = () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'wirewalk-lifecycle-'));
  dirs.push(dir);
  return dir;
};
afterAll(() => {
  for (const dir of dirs) rmSync(dir, { recursive: true, force: true });
});

describe('startPrivateMariaDb', () => {
  it('refuses a port something else listens on, naming DB_PORT, and never connects to it', async () => {
    const port = await freePort();
    const squatter = net.createServer((socket) => socket.destroy());
    await new Promise<void>((r) => squatter.listen(port, '127.0.0.1', () => r()));
    try {
      await expect(startPrivateMariaDb({ dataDir: tempDir(), port })).rejects.toThrow(/DB_PORT/);
    } finally {
      await new Promise<void>((r) => squatter.close(() => r()));
    }
  });

  it('initialises a folder with a stale pid file and socket from a crashed run, serves, stops, and keeps the data for the next start', async () => {
    const dataDir = tempDir();
    mkdirSync(dataDir, { recursive: true });
    // A pid no process has (above the kernel's default pid_max) and a leftover socket file.
    writeFileSync(path.join(dataDir, 'mysqld.pid'), '4194305\n');
    writeFileSync(path.join(dataDir, 'mysqld.sock'), '');
    const port = await freePort();
    const first = await startPrivateMariaDb({ dataDir, port, database: 'lifecycle' });
    expect(first.url).toBe(`mysql://root@127.0.0.1:${port}/lifecycle`);
    const conn = await mysql.createConnection({ uri: first.url });
    await conn.query('CREATE TABLE kept (n INT)');
    await conn.query('INSERT INTO kept VALUES (42)');
    await conn.end();
    await first.stop();
    expect(await isPortFree(port)).toBe(true);
    expect(existsSync(path.join(dataDir, 'mysqld.pid'))).toBe(false);

    const second = await startPrivateMariaDb({ dataDir, port, database: 'lifecycle' });
    try {
      const again = await mysql.createConnection({ uri: second.url });
      const [rows] = await again.query<mysql.RowDataPacket[]>('SELECT n FROM kept');
      await again.end();
      expect(rows.map((r) => r.n)).toEqual([42]);
    } finally {
      await second.stop();
    }
  });
});
