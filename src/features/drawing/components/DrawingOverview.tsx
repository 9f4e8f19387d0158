/**
 * The zoomed-out overview of a big drawing: one picture of the whole drawing (painted by the overview
 * worker, shown as an image) placed in the flow's coordinates, so it pans and zooms with the viewport as one
 * element, and a light layer on top marking the selected, walked and live items. Below OVERVIEW_ZOOM it
 * stands in for the hundreds of component nodes and wires: nothing to mount when zooming out and
 * nothing to hit-test when panning. A click on it zooms in there.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import { ViewportPortal, useStore, type ReactFlowState } from '@xyflow/react';
import type { HarnessDocument } from '@shared/harness';
import type { Positions } from '@shared/drawing/geometry';
import type { OverviewAnswer, OverviewRequest } from '../overview.worker';
import { overviewMarks } from '@shared/drawing/svg';
import { workerCalls } from '../workerCalls';
import { OVERVIEW_ZOOM } from '../zoom';
import type { FlowInput } from '../flow';

/** How long the document and positions must have stayed the same before a new picture is asked for. */
const SETTLE_MS = 250;

const painter = workerCalls<OverviewRequest, OverviewAnswer>(() => new Worker(new URL('../overview.worker.ts', import.meta.url), { type: 'module' }), 'overview');

export interface OverviewPicture {
  /** The PNG's object URL, decoded before it is handed out. */
  url: string;
  /** Where it lies in the drawing: x, y, width and height in the flow's coordinates. */
  x: number;
  y: number;
  width: number;
  height: number;
  /** Painted from something older than the drawing now shown (a newer one is on its way). */
  stale: boolean;
}

/**
 * The overview picture of `doc` at `positions`, painted in the worker while `enabled` and not `held`
 * (a layout on its way would make it stale at once): at once the first time, then once the document
 * and positions have settled for a moment after a change. Until a new one arrives the last picture
 * stands (marked stale).
 */
export function useOverviewPicture(
  doc: HarnessDocument | undefined,
  positions: Positions | undefined,
  enabled: boolean,
  held = false,
): { picture: OverviewPicture | null; failed: boolean } {
  const [painted, setPainted] = useState<{ url: string; bounds: { x: number; y: number; w: number; h: number }; doc: HarnessDocument; positions: Positions } | null>(null);
  const [failed, setFailed] = useState(false);
  const fresh = !!painted && painted.doc === doc && painted.positions === positions;
  const missing = !painted;
  useEffect(() => {
    if (!enabled || held || !doc || !positions || fresh) return;
    let wanted = true;
    const timer = window.setTimeout(() => {
      const started = performance.now();
      // Sharp up to the zoom where the nodes take over, on this screen.
      const sharpScale = OVERVIEW_ZOOM * Math.min(2, window.devicePixelRatio || 1);
      painter
        .call({ doc, positions, sharpScale })
        .then(async (a) => {
          if (!a.ok) throw new Error(a.message);
          if (!wanted) return;
          const url = URL.createObjectURL(a.png);
          // Decoded (off the main thread) before it is shown, so it never comes up blank.
          const img = new Image();
          img.src = url;
          await img.decode().catch(() => undefined);
          if (!wanted) return URL.revokeObjectURL(url);
          performance.measure('ww-overview-build', { start: started, detail: { components: doc.components.length, workerMs: a.ms } });
          setPainted({ url, bounds: a.raster.bounds, doc, positions });
        })
        // No picture (an old browser without OffscreenCanvas): the nodes stay drawn at every zoom.
        .catch((error: unknown) => {
          console.warn('The overview picture could not be painted:', error);
          if (wanted) setFailed(true);
        });
    }, missing ? 0 : SETTLE_MS);
    return () => {
      wanted = false;
      window.clearTimeout(timer);
    };
  }, [enabled, held, doc, positions, fresh, missing]);
  // A picture's URL is let go once the next one is shown (or the drawing closes).
  const url = painted?.url;
  useEffect(() => (url ? () => URL.revokeObjectURL(url) : undefined), [url]);
  const picture = useMemo(() => {
    if (!painted) return null;
    const { bounds } = painted;
    return { url: painted.url, x: bounds.x, y: bounds.y, width: bounds.w, height: bounds.h, stale: !fresh };
  }, [painted, fresh]);
  return { picture, failed: failed && !painted };
}

const zoomSelector = (s: ReactFlowState) => s.transform[2];

export interface DrawingOverviewProps {
  picture: OverviewPicture;
  input: FlowInput;
  /** On screen (hidden, it is neither painted nor hit-tested). */
  shown: boolean;
  /** A click on the picture, at this point of the drawing. */
  onZoomAt: (x: number, y: number) => void;
}

/**
 * The picture and, while shown, its marks, inside the viewport. One image at the finest scale: the
 * browser filters it down smoothly at any zoom and rasters only the part in view, off the main thread.
 */
export function DrawingOverview({ picture, input, shown, onZoomAt }: DrawingOverviewProps) {
  const down = useRef<{ x: number; y: number } | null>(null);
  const box = { position: 'absolute', left: picture.x, top: picture.y, width: picture.width, height: picture.height } as const;
  return (
    <ViewportPortal>
      <div
        role="img"
        aria-label={`Overview of ${input.doc.name}: click to zoom in there`}
        className="ww-overview"
        data-overview=""
        data-stale={picture.stale ? '' : undefined}
        style={{ ...box, display: shown ? 'block' : 'none', pointerEvents: 'auto' }}
        onMouseDown={(e) => {
          down.current = { x: e.clientX, y: e.clientY };
        }}
        onClick={(e) => {
          // Not the pane's click (which would clear the selection); and not the end of a drag.
          e.stopPropagation();
          const d = down.current;
          if (d && Math.hypot(e.clientX - d.x, e.clientY - d.y) > 4) return;
          const r = e.currentTarget.getBoundingClientRect();
          onZoomAt(picture.x + ((e.clientX - r.left) / r.width) * picture.width, picture.y + ((e.clientY - r.top) / r.height) * picture.height);
        }}
      >
        <img src={picture.url} alt="" draggable={false} decoding="async" style={{ position: 'absolute', inset: 0, width: '100%', height: '100%' }} />
      </div>
      {shown ? <OverviewMarks picture={picture} input={input} /> : null}
    </ViewportPortal>
  );
}

/** The selected, walked and live items over the picture. */
function OverviewMarks({ picture, input }: { picture: OverviewPicture; input: FlowInput }) {
  const zoom = useStore(zoomSelector);
  const { doc, positions, selectedNodes, selectedEdges, highlightPins, highlightWires, volts } = input;
  const marks = useMemo(
    () => overviewMarks(doc, positions, { walkPins: highlightPins, walkWires: highlightWires, selectedComponents: selectedNodes, selectedWires: selectedEdges, volts }),
    [doc, positions, selectedNodes, selectedEdges, highlightPins, highlightWires, volts],
  );
  // Live wires under the walked and selected ones.
  const [live, marked] = useMemo(() => [marks.wires.filter((w) => w.kind === 'live'), marks.wires.filter((w) => w.kind !== 'live')], [marks]);
  // Marks keep a size on screen whatever the zoom: widths in screen pixels, divided by the zoom.
  const px = (v: number) => v / zoom;
  if (!marks.wires.length && !marks.boxes.length) return null;
  return (
    <svg
      className="ww-overview-marks"
      aria-hidden="true"
      style={{ position: 'absolute', left: picture.x, top: picture.y, width: picture.width, height: picture.height, overflow: 'visible', pointerEvents: 'none' }}
      viewBox={`${picture.x} ${picture.y} ${picture.width} ${picture.height}`}
    >
      <g fill="none" strokeLinecap="round">
        {live.map((w) => (
          <path key={w.id} d={w.d} data-mark="live" className="ww-mark-live" strokeWidth={px(1.5)} strokeDasharray={`${px(2)} ${px(3)}`} />
        ))}
        {marked.map((w) => (
          <path key={`halo-${w.id}`} d={w.d} className="ww-mark-halo" strokeWidth={px(8)} />
        ))}
        {marked.map((w) => (
          <path key={w.id} d={w.d} data-mark={w.kind} className={`ww-mark-${w.kind}`} strokeWidth={px(4)} strokeDasharray={w.kind === 'selected' ? `${px(8)} ${px(5)}` : undefined} />
        ))}
      </g>
      <g fill="none">
        {marks.boxes.map((b) => {
          // At least 18 px across on screen, however small the part is drawn.
          const [padX, padY] = [Math.max(px(4), (px(18) - b.w) / 2), Math.max(px(4), (px(18) - b.h) / 2)];
          return (
            <rect key={b.id} x={b.x - padX} y={b.y - padY} width={b.w + 2 * padX} height={b.h + 2 * padY} rx={px(3)} data-mark={b.kind} className={`ww-mark-${b.kind}`} strokeWidth={px(2.5)} strokeDasharray={b.kind === 'selected' ? `${px(6)} ${px(4)}` : undefined} />
          );
        })}
      </g>
    </svg>
  );
}
