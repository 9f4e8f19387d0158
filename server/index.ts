// npm start: database, migrations, demo seed, client build, listen, graceful stop.
// Only light modules load first: MariaDB and the client build start at once, and the app's
// modules load while they run.
import path from 'node:path';
import { loadConfig } from './config';
import { buildClient, clientNeedsBuild } from './client-build';
import { startPrivateMariaDb } from './db/mariadb';

const dev = process.env.WIREWALK_DEV === '1';

async function main() {
  const config = loadConfig();
  const log = (line: string) => console.log(line);
  const mariadb = config.databaseUrl
    ? undefined
    : startPrivateMariaDb({ dataDir: path.join(config.dataDir, 'mariadb'), port: config.dbPort, log }).then((db) => {
        log(`MariaDB answers (${process.uptime().toFixed(1)} s).`);
        return db;
      });
  mariadb?.catch(() => {});
  const building = !dev && clientNeedsBuild(config.clientDir) ? buildClient(log, config.clientDir) : undefined;
  building?.catch(() => {});
  let startWirewalk: typeof import('./start').startWirewalk;
  try {
    ({ startWirewalk } = await import('./start'));
  } catch (err) {
    await (await mariadb?.catch(() => null))?.stop();
    throw err;
  }
  const running = await startWirewalk(config, { client: !dev, log, mariadb, building });
  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal}: stopping…`);
    running.stop().then(
      () => process.exit(0),
      (err) => {
        console.error(err);
        process.exit(1);
      },
    );
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
}

main().catch((err: Error) => {
  console.error(`Wirewalk could not start: ${err.message}`);
  process.exit(1);
});
