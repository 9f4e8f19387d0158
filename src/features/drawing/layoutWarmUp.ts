/** What the layout worker warms elkjs up on (see layout.worker), and how many runs of it; the page counts its runs too. */
import type { HarnessDocument } from '@shared/harness';

/**
 * Runs of the made-up harness that warm elkjs up: after about twenty a full layout of a
 * 100-circuit drawing takes under half its cold time (measured in Node: 0.78 s against 1.5 s).
 */
export const WARM_RUNS = 20;

/**
 * The runs sent one at a time while a laid-out drawing is open (warmUpWhenIdle), as circuits of the
 * made-up harness: WARM_RUNS small ones, then a few bigger ones, which take the paths a big drawing
 * takes (each still well under a second in the worker, the longest a pan can meet).
 */
export const WARM_UP_STEPS: readonly number[] = [...Array<number>(WARM_RUNS).fill(12), 24, 48, 48];

/** A few circuits with every kind of node the layout treats differently (ports, a mated pair, splices). */
export function warmUpDocument(circuits = 12): Pick<HarnessDocument, 'components' | 'wires'> {
  const components: HarnessDocument['components'] = [
    { id: 'B', kind: 'battery', volts: 12 },
    { id: 'G', kind: 'ground' },
    { id: 'S', kind: 'splice' },
    { id: 'R', kind: 'splice' },
  ];
  const wires: HarnessDocument['wires'] = [];
  const wire = (id: string, from: string, to: string) => wires.push({ id, from, to, size: { mm2: 1 }, lengthM: 1 });
  wire('w0', 'B.+', 'S.S');
  wire('w1', 'B.-', 'G.G');
  wire('w2', 'R.S', 'G.G');
  for (let i = 0; i < circuits; i++) {
    components.push(
      { id: `F${i}`, kind: 'fuse', amps: 10 },
      { id: `A${i}`, kind: 'connector', cavities: ['1', '2', '3'], matesWith: `C${i}` },
      { id: `C${i}`, kind: 'connector', cavities: ['1', '2', '3'] },
      { id: `L${i}`, kind: 'load', ohms: 10 },
    );
    wire(`a${i}`, 'S.S', `F${i}.1`);
    wire(`b${i}`, `F${i}.2`, `A${i}.1`);
    wire(`c${i}`, `C${i}.1`, `L${i}.1`);
    wire(`d${i}`, `L${i}.2`, `C${i}.2`);
    wire(`e${i}`, `A${i}.2`, 'R.S');
  }
  return { components, wires };
}
