// The drawing's layout on a thread of its own, so a big harness never holds up the server's requests.
// Plain JavaScript that loads the TypeScript through tsx's scoped import: it runs the same under
// `npm start` (tsx) and under the test runner.
import { parentPort } from 'node:worker_threads';
import { tsImport } from 'tsx/esm/api';

const { layOutDocument } = await tsImport('./layout.ts', import.meta.url);

parentPort.on('message', async ({ id, doc }) => {
  try {
    parentPort.postMessage({ id, positions: await layOutDocument(doc) });
  } catch (error) {
    parentPort.postMessage({ id, error: error instanceof Error ? error.message : String(error) });
  }
});
