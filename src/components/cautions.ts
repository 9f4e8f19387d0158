/**
 * The safety cautions Wirewalk shows where work can hurt someone (product.md).
 * One module so every feature shows the same words: pick by id and render
 * with <Caution id="..." /> (components/Caution.tsx).
 */

export interface CautionText {
  /** A short imperative headline. */
  title: string;
  /** What to do and why, in a sentence or two. */
  text: string;
}

export const cautions = {
  disconnectBattery: {
    title: 'Disconnect the battery first',
    text: 'Disconnect the battery before you cut, splice or repin a harness. A live circuit can arc, burn a wire or fire an output.',
  },
  blockAttachments: {
    title: 'Lower or block attachments, relieve hydraulic pressure',
    text: 'Lower the attachment to the ground or block it, stop the engine and relieve hydraulic pressure before you work near arms, cylinders, hoses or couplers.',
  },
  fuseRating: {
    title: 'Never fit a larger fuse',
    text: 'Fit only a fuse of the rating the circuit calls for. A larger fuse lets the wire overheat before it blows.',
  },
  arcingFuse: {
    title: 'A fuse that blows with an arc: stop',
    text: 'If a fuse blows the moment it goes in, or with an arc, stop and find the short. Do not keep fitting fuses.',
  },
  backProbe: {
    title: 'Back-probe without spreading terminals',
    text: 'Probe from the back of the connector along the wire, with a probe thin enough not to spread the terminal or tear the seal.',
  },
  expectations: {
    title: 'Readings here are expectations',
    text: 'Expected readings come from the harness as documented in Wirewalk, not from the manufacturer’s specification. The service manual, local codes and licensed practice govern.',
  },
} as const satisfies Record<string, CautionText>;

export type CautionId = keyof typeof cautions;

/** Cautions a feature will usually want together, e.g. before repair work on a harness. */
export const cautionSets = {
  harnessRepair: ['disconnectBattery', 'blockAttachments', 'expectations'],
  fuses: ['fuseRating', 'arcingFuse'],
  measuring: ['backProbe', 'expectations'],
} as const satisfies Record<string, readonly CautionId[]>;
