import { execFileSync } from 'node:child_process';
import { join } from 'node:path';

/**
 * The benchmark harness writer lives in the design folder `shared/` beside the checkout
 * (../shared/bench/make_harness.py), wherever the clone is; MAKE_HARNESS overrides it.
 */
export const makeHarnessScript = process.env.MAKE_HARNESS ?? join(import.meta.dirname, '..', '..', '..', 'shared', 'bench', 'make_harness.py');

/** A large valid harness document of `circuits` circuits, as JSON text. */
export function makeHarnessText(circuits: number): string {
  return execFileSync('python3', [makeHarnessScript, String(circuits)], { encoding: 'utf8', maxBuffer: 512 * 1024 * 1024 });
}
