import type { Clamp, HarnessDocument } from '@shared/harness';

/**
 * A small drawing the drawing tests share: battery, fuse, a connector half and a ground in a
 * row, with `clamps` on its wires. F1's pin 2 and X1A's cavity 1 sit on one level, so W2 runs
 * straight: its middle is easy to know.
 */
export function boomLights(clamps: Clamp[]): HarnessDocument {
  return {
    format: 'wirewalk-harness',
    version: 1,
    name: 'Boom lights',
    nominalVolts: 12,
    temperatureC: 20,
    components: [
      { id: 'BATT', kind: 'battery', volts: 12.6 },
      { id: 'F1', kind: 'fuse', amps: 10 },
      { id: 'X1A', kind: 'connector', cavities: ['1', '2'] },
      { id: 'G1', kind: 'ground' },
    ],
    wires: [
      { id: 'W1', from: 'BATT.+', to: 'F1.1', color: 'RD', size: { mm2: 2.5 }, lengthM: 0.5 },
      { id: 'W2', from: 'F1.2', to: 'X1A.1', color: 'RD/WH', size: { mm2: 1.5 }, lengthM: 2 },
      { id: 'W3', from: 'X1A.2', to: 'G1.G', color: 'BK', size: { mm2: 1.5 }, lengthM: 1 },
    ],
    clamps,
    states: [],
  };
}

export const boomLightsPositions = { BATT: { x: -200, y: -20 }, F1: { x: 0, y: 0 }, X1A: { x: 300, y: -18 }, G1: { x: 520, y: 40 } };
