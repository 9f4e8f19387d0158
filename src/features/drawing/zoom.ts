import { useStore, type ReactFlowState } from '@xyflow/react';

/** Below this zoom the drawing is compact: no captions, no wire labels. */
export const COMPACT_ZOOM = 0.55;

/** Below this zoom (a whole big drawing in view) only boxes and wire colours: no text can be read there. */
export const TINY_ZOOM = 0.25;

/**
 * Below this zoom a big drawing shows one overview picture of the whole of it instead of its nodes
 * and wires (none of their text could be read there anyway).
 */
export const OVERVIEW_ZOOM = TINY_ZOOM;

const tinySelector = (s: ReactFlowState) => s.transform[2] < TINY_ZOOM;

/**
 * True below TINY_ZOOM. Nodes and wires then leave out what cannot be seen (text, outlines), so the
 * hundreds that come into view while panning zoomed out are cheap to mount. Re-renders only when the
 * threshold is crossed, not on every zoom step.
 */
export const useTiny = (): boolean => useStore(tinySelector);
