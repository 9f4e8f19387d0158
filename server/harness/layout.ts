/**
 * The drawing's layout in Node, as the editor runs it in its worker: elkjs (the bundled build)
 * over shared/drawing/layout's graph. For documents stored without positions (the demo seed, and
 * imports through layout-thread.ts, which runs this off the request thread), so the editor opens
 * them laid out instead of laying them out and saving at once.
 */
import ELK from 'elkjs/lib/elk.bundled.js';
import { layOutDrawing } from '../../shared/drawing/layout';
import type { HarnessDocument } from '../../shared/harness';
import type { Positions } from './rows';

const elk = new ELK();

/** Positions for every component of the document. */
export function layOutDocument(doc: Pick<HarnessDocument, 'components' | 'wires'>): Promise<Positions> {
  return layOutDrawing(elk, { doc });
}
