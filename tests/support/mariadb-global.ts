import { scratchDir } from './scratch';
import { mkdtempSync, rmSync } from 'node:fs';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { freePort, startPrivateMariaDb } from '../../server/db/mariadb';

declare module 'vitest' {
  export interface ProvidedContext {
    /** `mysql://root@127.0.0.1:<port>/`: a server where each test file makes its own database. */
    mariadbRootUrl: string;
  }
}

/**
 * vitest globalSetup of the server project: one private MariaDB in a fresh temporary folder
 * on a free port for the whole run, stopped and deleted afterwards. TEST_DATABASE_URL
 * (a server URL whose user may create and drop databases) uses an existing server instead.
 */
export default async function setup(project: TestProject) {
  const existing = process.env.TEST_DATABASE_URL;
  if (existing) {
    const url = new URL(existing);
    url.pathname = '/';
    project.provide('mariadbRootUrl', url.toString());
    return;
  }
  const dataDir = mkdtempSync(path.join(scratchDir(), 'wirewalk-test-db-'));
  const port = await freePort();
  const server = await startPrivateMariaDb({ dataDir, port, database: null });
  project.provide('mariadbRootUrl', server.rootUrl);
  return async () => {
    await server.stop();
    rmSync(dataDir, { recursive: true, force: true });
  };
}
