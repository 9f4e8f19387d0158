/**
 * The zoomed-out overview of a big drawing: one picture of the whole drawing (the SVG renderer's
 * bare output, as an image) placed in the flow's coordinates, so it pans and zooms with the viewport
 * as one element, and a light layer on top marking the selected, walked and live items. Below
 * OVERVIEW_ZOOM it stands in for the hundreds of component nodes and wires: nothing to mount when
 * zooming out and nothing to hit-test when panning. A click on it zooms in there.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import { ViewportPortal, useStore, type ReactFlowState } from '@xyflow/react';
import type { HarnessDocument } from '@shared/harness';
import type { Positions } from '../geometry';
import { overviewMarks, renderDrawingSvg } from '../svg';
import type { FlowInput } from '../flow';

/** How long the drawing must have been still before a changed picture is redrawn. */
const QUIET_MS = 1000;

export interface OverviewPicture {
  url: string;
  x: number;
  y: number;
  width: number;
  height: number;
}

/** The picture as an image: a blob URL of the SVG and where it lies in the drawing. */
export function buildOverviewPicture(doc: HarnessDocument, positions: Positions): OverviewPicture {
  const t0 = performance.now();
  const svg = renderDrawingSvg(doc, positions, {}, [], { bare: true });
  const [x, y, width, height] = (/viewBox="([^"]+)"/.exec(svg)?.[1] ?? '0 0 0 0').split(' ').map(Number);
  const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
  performance.measure('ww-overview-build', { start: t0, detail: { components: doc.components.length } });
  return { url, x, y, width, height };
}

/**
 * The overview picture of `doc` at `positions`, drawn off the hot path: while `enabled`, in an idle
 * moment once the drawing has been still (no pan, zoom or drag: `lastMove`, a performance.now() time)
 * for a second after the document or positions last changed. Until then the last picture stands (a
 * dragged part shows at its old place for that moment); only with no picture at all and `now` (the
 * overview is on screen) is one built at once.
 */
export function useOverviewPicture(
  doc: HarnessDocument | undefined,
  positions: Positions | undefined,
  enabled: boolean,
  now: boolean,
  lastMove: { current: number },
): OverviewPicture | null {
  const [picture, setPicture] = useState<{ pic: OverviewPicture; doc: HarnessDocument; positions: Positions } | null>(null);
  const fresh = !!picture && picture.doc === doc && picture.positions === positions;
  const warmed = useRef<HTMLImageElement | null>(null);
  const missing = !picture;
  useEffect(() => {
    if (!enabled || !doc || !positions || fresh) return;
    const build = () => {
      const pic = buildOverviewPicture(doc, positions);
      // Loaded and parsed now, while nothing moves, rather than the first time the overview shows.
      const warm = new Image();
      warm.src = pic.url;
      warm.decode().catch(() => undefined);
      warmed.current = warm;
      setPicture({ pic, doc, positions });
    };
    if (now && missing) {
      build();
      return;
    }
    let idle: number | null = null;
    let timer = 0;
    const wait = (ms: number) => {
      timer = window.setTimeout(() => {
        if (performance.now() - lastMove.current < QUIET_MS) return wait(QUIET_MS);
        if (typeof requestIdleCallback === 'function') idle = requestIdleCallback(build, { timeout: 2000 });
        else build();
      }, ms);
    };
    wait(missing ? 300 : QUIET_MS);
    return () => {
      window.clearTimeout(timer);
      if (idle !== null) cancelIdleCallback(idle);
    };
  }, [enabled, doc, positions, fresh, now, missing, lastMove]);
  // An old picture's URL is given up once a new one replaces it (or the drawing goes).
  const url = picture?.pic.url;
  useEffect(() => () => {
    if (url) URL.revokeObjectURL(url);
  }, [url]);
  return picture?.pic ?? null;
}

const zoomSelector = (s: ReactFlowState) => s.transform[2];

export interface DrawingOverviewProps {
  picture: OverviewPicture | null;
  input: FlowInput;
  /** A click on the picture, at this point of the drawing. */
  onZoomAt: (x: number, y: number) => void;
}

/** The picture and its marks, inside the viewport (rendered only while the overview is on). */
export function DrawingOverview({ picture, input, onZoomAt }: DrawingOverviewProps) {
  const zoom = useStore(zoomSelector);
  const { doc, positions, selectedNodes, selectedEdges, highlightPins, highlightWires, volts } = input;
  const marks = useMemo(
    () => overviewMarks(doc, positions, { walkPins: highlightPins, walkWires: highlightWires, selectedComponents: selectedNodes, selectedWires: selectedEdges, volts }),
    [doc, positions, selectedNodes, selectedEdges, highlightPins, highlightWires, volts],
  );
  const down = useRef<{ x: number; y: number } | null>(null);
  // Marks keep a size on screen whatever the zoom: widths in screen pixels, divided by the zoom.
  const px = (v: number) => v / zoom;
  if (!picture) return null;
  return (
    <ViewportPortal>
      <img
        src={picture.url}
        alt={`Overview of ${doc.name}: click to zoom in there`}
        className="ww-overview"
        data-overview=""
        draggable={false}
        decoding="async"
        style={{ position: 'absolute', left: picture.x, top: picture.y, width: picture.width, height: picture.height, pointerEvents: 'auto' }}
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
      />
      {marks.wires.length || marks.boxes.length ? (
        <svg
          className="ww-overview-marks"
          aria-hidden="true"
          style={{ position: 'absolute', left: picture.x, top: picture.y, width: picture.width, height: picture.height, overflow: 'visible', pointerEvents: 'none' }}
          viewBox={`${picture.x} ${picture.y} ${picture.width} ${picture.height}`}
        >
          <g fill="none" strokeLinecap="round">
            {marks.wires.map((w) => (
              <path key={w.id} d={w.d} data-mark={w.kind} className={`ww-mark-${w.kind}`} strokeWidth={px(w.kind === 'live' ? 2 : 4)} strokeDasharray={w.kind === 'selected' ? `${px(8)} ${px(5)}` : undefined} />
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
      ) : null}
    </ViewportPortal>
  );
}
