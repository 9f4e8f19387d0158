/**
 * The walk's k-shortest simple paths against a brute-force enumeration of every simple path
 * (depth-first search), on random small graphs with the shapes harnesses have: dead-end
 * branches, chains, rings, parallel edges, self loops and pieces apart (fast-check).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { kShortestPaths, walkGraphOf, type WalkEdge, type WalkGraph } from '../../shared/engine/walk';

function graphOf(n: number, list: [number, number, number][]): WalkGraph {
  return walkGraphOf(n, list.map(([a, b, ohms], i): WalkEdge => ({ type: 'wire', a, b, ohms, ref: i, sub: 0 })));
}

/** Every simple path from s to t as (ohms, steps), shortest first. */
function allSimplePaths(g: WalkGraph, s: number, t: number): { ohms: number; steps: number }[] {
  const out: { ohms: number; steps: number }[] = [];
  const on = new Uint8Array(g.n);
  const go = (x: number, ohms: number, steps: number) => {
    if (x === t) {
      out.push({ ohms, steps });
      return;
    }
    on[x] = 1;
    for (let q = g.ptr[x]; q < g.ptr[x + 1]; q++) {
      const e = g.edges[g.inc[q]];
      if (e.a === e.b) continue;
      const y = e.a === x ? e.b : e.a;
      if (!on[y]) go(y, ohms + e.ohms, steps + 1);
    }
    on[x] = 0;
  };
  go(s, 0, 0);
  return out.sort((p, q) => (Math.abs(p.ohms - q.ohms) > 1e-9 ? p.ohms - q.ohms : p.steps - q.steps));
}

/** Random harness-like graphs: a ring or two, branches hanging off, chains, parallel edges, a loop, a piece apart. */
const graphs = fc
  .record({
    n: fc.integer({ min: 2, max: 11 }),
    extra: fc.array(fc.tuple(fc.nat(), fc.nat(), fc.constantFrom(0, 0.001, 0.01, 0.5, 1, 2, 10, 120)), { maxLength: 14 }),
    tree: fc.array(fc.tuple(fc.nat(), fc.constantFrom(0, 0.002, 0.1, 1, 5)), { maxLength: 10 }),
    s: fc.nat(),
    t: fc.nat(),
    k: fc.integer({ min: 1, max: 20 }),
  })
  .map(({ n, extra, tree, s, t, k }) => {
    const list: [number, number, number][] = [];
    // A spanning-ish tree (vertex i hangs off an earlier one), which leaves dead ends and chains…
    tree.slice(0, n - 1).forEach(([p, ohms], i) => list.push([p % (i + 1), i + 1, ohms]));
    // …then extra edges close rings, double up edges, add self loops.
    for (const [a, b, ohms] of extra) list.push([a % n, b % n, ohms]);
    return { g: graphOf(n, list), s: s % n, t: t % n, k };
  });

describe('k shortest simple paths', () => {
  it('agree with every simple path enumerated by brute force, in order (fast-check)', () => {
    fc.assert(
      fc.property(graphs, ({ g, s, t, k }) => {
        const got = kShortestPaths(g, s, t, k);
        if (s === t) {
          expect(got).toHaveLength(1);
          return;
        }
        const want = allSimplePaths(g, s, t).slice(0, k);
        expect(got.map((p) => p.ohms)).toHaveLength(want.length);
        got.forEach((p, i) => {
          expect(p.ohms).toBeCloseTo(want[i].ohms, 9);
          // Ties in ohms may come in either order, but the steps must be among the tied ones.
          const tied = want.filter((w) => Math.abs(w.ohms - p.ohms) <= 1e-9).map((w) => w.steps);
          expect(tied).toContain(p.edges.length);
          // A real simple path from s to t along the graph's edges.
          expect(p.vertices[0]).toBe(s);
          expect(p.vertices[p.vertices.length - 1]).toBe(t);
          expect(new Set(p.vertices).size).toBe(p.vertices.length);
          p.edges.forEach((ei, j) => {
            const e = g.edges[ei];
            expect([e.a, e.b].sort()).toEqual([p.vertices[j], p.vertices[j + 1]].sort());
          });
        });
        // No path twice.
        expect(new Set(got.map((p) => p.edges.join(','))).size).toBe(got.length);
      }),
      { numRuns: 1500, seed: 20261202 },
    );
  });
});
