// npm start: database, migrations, demo seed, client build, listen, graceful stop.
import { loadConfig } from './config';
import { startWirewalk } from './start';

const dev = process.env.WIREWALK_DEV === '1';

async function main() {
  const config = loadConfig();
  const running = await startWirewalk(config, { client: !dev });
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
