import type { Server } from 'node:http';
import path from 'node:path';
import { and, eq, isNull, lt } from 'drizzle-orm';
import { createApp } from './app';
import type { Config } from './config';
import type { AppDeps } from './deps';
import { createDb } from './db/client';
import { isPortFree, startPrivateMariaDb, type PrivateMariaDb } from './db/mariadb';
import { runMigrations } from './db/migrate';
import { invitations, passwordResetTokens, sessions, users } from './db/schema';
import { startFakeSmtp, type FakeSmtp } from './mail/fake-smtp';
import { smtpMailer, type Mailer } from './mail/mailer';
import { diskStorage } from './storage';
import { buildClient, clientNeedsBuild } from './client-build';
import { settleRateLimitWrites, sweepRateLimits } from './auth/rate-limit-store';
import { DEMO_PASSWORD, databaseIsEmpty, demoShop, seedDemo } from '../seeds/index';
import { krT78MainHarness } from '../seeds/harnesses/index';
import { layOutOffThread, stopLayoutThread } from './harness/layout-thread';

export interface StartOptions {
  /** Build the client when dist/ is missing or older than its sources, and serve it. */
  client: boolean;
  log?: (line: string) => void;
  /** A private MariaDB already starting (server/index.ts starts it before loading the app). */
  mariadb?: Promise<PrivateMariaDb>;
  /** A client build already under way. */
  building?: Promise<void>;
}

export interface Running {
  url: string;
  deps: AppDeps;
  server: Server;
  stop(): Promise<void>;
}

function portError(err: NodeJS.ErrnoException, config: Config): Error {
  return err.code === 'EADDRINUSE' ? new Error(`Port ${config.port} on ${config.host} is in use: set PORT to a free port.`) : err;
}

/**
 * npm start (and npm run dev's API): the private MariaDB unless DATABASE_URL, migrations,
 * the demo shop into an empty database, the client build if needed, then listen.
 */
export async function startWirewalk(config: Config, options: StartOptions): Promise<Running> {
  const log = options.log ?? ((line: string) => console.log(line));
  // Seconds since the process started (module loading included).
  const since = () => `${process.uptime().toFixed(1)} s`;
  const cleanup: (() => Promise<void>)[] = [];
  const runCleanup = async () => {
    for (const step of cleanup.reverse()) await step().catch((err: Error) => log(`shutdown: ${err.message}`));
    cleanup.length = 0;
  };

  try {
    if (options.mariadb) {
      // Whatever happens next, the server that was started gets stopped.
      cleanup.push(async () => (await options.mariadb!.catch(() => null))?.stop());
    }
    if (!(await isPortFree(config.port, config.host))) throw portError(Object.assign(new Error('in use'), { code: 'EADDRINUSE' }), config);
    // The build runs (in a child process) while MariaDB starts.
    const building = options.building ?? (options.client && clientNeedsBuild(config.clientDir) ? buildClient(log, config.clientDir) : Promise.resolve());
    building.catch(() => {});

    let mariadb: PrivateMariaDb | null = null;
    let url = config.databaseUrl;
    if (!url) {
      if (options.mariadb) mariadb = await options.mariadb;
      else {
        mariadb = await startPrivateMariaDb({ dataDir: path.join(config.dataDir, 'mariadb'), port: config.dbPort, log });
        cleanup.push(() => mariadb!.stop());
        log(`MariaDB answers (${since()}).`);
      }
      url = mariadb.url;
    }
    const { db, pool } = createDb(url);
    cleanup.push(async () => {
      await settleRateLimitWrites();
      await pool.end();
    });
    await runMigrations(db);
    log(`Migrations applied (${since()}).`);

    let mailer: Mailer;
    let fake: FakeSmtp | null = null;
    if (config.smtpUrl) {
      mailer = smtpMailer(config.smtpUrl, config.mailFrom);
    } else {
      fake = await startFakeSmtp(db, { log });
      cleanup.push(() => fake!.close());
      mailer = smtpMailer({ host: fake.host, port: fake.port, secure: false, ignoreTLS: true }, config.mailFrom);
      log(`No SMTP_URL: mail goes to the local outbox (fake SMTP on ${fake.host}:${fake.port}); the owner reads it under Outbox.`);
    }
    cleanup.push(() => mailer.close());

    const storage = diskStorage(path.join(config.dataDir, 'files'));
    const deps: AppDeps = { db, pool, config, mailer, storage, outbox: fake !== null, demo: false };

    if (config.demo !== false && (await databaseIsEmpty(db))) {
      log(`Empty database: loading the demo shop "${demoShop.name}".`);
      await seedDemo(deps);
      log(`Demo shop loaded (${since()}).`);
    }
    const demoOwner = await db.select({ id: users.id }).from(users).where(eq(users.email, demoShop.people[0].email)).limit(1);
    deps.demo = config.demo === false ? false : demoOwner.length > 0;
    if (config.demo === false && demoOwner.length > 0) log('Warning: DEMO=0 but the demo accounts exist in this database; remove them or change their passwords.');

    // Hourly: expired sessions and rate-limit windows; reset tokens and unaccepted invitations a week past expiry.
    const sweep = async () => {
      const now = new Date();
      const weekAgo = new Date(now.getTime() - 7 * 24 * 3600 * 1000);
      await db.delete(sessions).where(lt(sessions.expiresAt, now));
      await db.delete(passwordResetTokens).where(lt(passwordResetTokens.expiresAt, weekAgo));
      await db.delete(invitations).where(and(isNull(invitations.acceptedAt), lt(invitations.expiresAt, weekAgo)));
      await sweepRateLimits(pool);
    };
    const sweeper = setInterval(() => void sweep().catch((err: Error) => log(`cleanup: ${err.message}`)), 3600_000);
    sweeper.unref();
    cleanup.push(async () => clearInterval(sweeper));
    await sweep();

    await building;
    const app = createApp({ ...deps, config: { ...config, serveClient: options.client } });
    const server = await new Promise<Server>((resolve, reject) => {
      // Express 5 hands a listen error to the callback too.
      const s = app.listen(config.port, config.host, (err?: Error) => (err ? reject(portError(err, config)) : resolve(s)));
    });
    cleanup.push(
      () =>
        new Promise<void>((resolve) => {
          const force = setTimeout(() => server.closeAllConnections(), 5000);
          server.close(() => {
            clearTimeout(force);
            resolve();
          });
          server.closeIdleConnections();
        }),
    );
    // The layout thread loads elkjs and warms up on a small harness now, not on the first import.
    void layOutOffThread(krT78MainHarness);
    cleanup.push(async () => stopLayoutThread());
    const address = `http://${config.host}:${config.port}`;
    log(`Wirewalk is ready on ${address} (${since()})`);
    if (deps.demo) log(`Demo mode: ${demoShop.people.map((p) => p.email).join(', ')} — password ${DEMO_PASSWORD}`);
    let stopping: Promise<void> | null = null;
    return { url: address, deps, server, stop: () => (stopping ??= runCleanup()) };
  } catch (err) {
    await runCleanup();
    throw err;
  }
}
