import { useCallback, useLayoutEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import {
  ConnectionMode,
  ControlButton,
  Controls,
  ReactFlow,
  getNodesBounds,
  getViewportForBounds,
  useReactFlow,
  useStoreApi,
  type Connection,
  type Edge,
  type EdgeChange,
  type NodeChange,
  type OnMove,
  type Viewport,
} from '@xyflow/react';
import '@xyflow/react/dist/style.css';
import '../drawing.css';
import { ComponentNode, type ComponentFlowNode } from './ComponentNode';
import { WireEdge, type WireFlowEdge } from './WireEdge';
import { MateEdge, type MateFlowEdge } from './MateEdge';
import { openingViewport } from '@shared/drawing/geometry';
import { COMPACT_ZOOM, OVERVIEW_ZOOM, TINY_ZOOM } from '../zoom';
import type { FlowInput } from '../flow';
import { DrawingOverview, useOverviewPicture } from './DrawingOverview';
import { frameBatches } from '../frameBatches';
import { Loading } from '@/components';

const nodeTypes = { component: ComponentNode };
const edgeTypes = { wire: WireEdge, mate: MateEdge };

/** Above this many components the drawing draws only what is in view. */
export const BIG_DRAWING = 300;

/** The zoom a big drawing opens at: every label readable. */
export const WORKING_ZOOM = 0.8;

export { COMPACT_ZOOM, OVERVIEW_ZOOM, TINY_ZOOM } from '../zoom';

/** How many nodes come back in the first frame when zooming in out of the overview (then: see FRAME_BUDGET_MS). */
const FILL_BATCH = 8;
/**
 * What a frame of the filling may cost, its rendering included (frameBatches): below the 50 ms of a
 * long task with room for a pan or zoom step in the same frame. Mounting a node costs several times
 * more on a slow machine, or before the browser has compiled the code for it.
 */
const FRAME_BUDGET_MS = 25;

interface Held {
  nodes: ComponentFlowNode[];
  edges: Array<WireFlowEdge | MateFlowEdge>;
}
const NOTHING_HELD: Held = { nodes: [], edges: [] };

interface Area {
  x: number;
  y: number;
  w: number;
  h: number;
}
/** The stretch of the drawing in view, in its own coordinates, from xyflow's transform and pane size. */
const viewOf = (s: { transform: [number, number, number]; width: number; height: number }): Area => {
  const [tx, ty, k] = s.transform;
  return { x: -tx / k, y: -ty / k, w: s.width / k, h: s.height / k };
};
/** Whether a box reaches into the view widened by a quarter of it on every side (what the fill brings back first). */
const nearView = (v: Area, left: number, top: number, right: number, bottom: number): boolean =>
  right > v.x - v.w / 4 && left < v.x + (v.w * 5) / 4 && bottom > v.y - v.h / 4 && top < v.y + (v.h * 5) / 4;

export interface DrawingCanvasProps {
  nodes: ComponentFlowNode[];
  edges: Array<WireFlowEdge | MateFlowEdge>;
  readOnly?: boolean;
  onNodesChange?: (changes: NodeChange<ComponentFlowNode>[]) => void;
  onEdgesChange?: (changes: EdgeChange<WireFlowEdge | MateFlowEdge>[]) => void;
  onConnect?: (c: Connection) => void;
  onReconnect?: (old: Edge, c: Connection) => void;
  onNodeDragStart?: () => void;
  onNodeDragStop?: () => void;
  onNodeClick?: (id: string, event: React.MouseEvent) => void;
  onEdgeClick?: (id: string, event: React.MouseEvent) => void;
  onPaneClick?: () => void;
  onViewportChange?: (v: Viewport) => void;
  children?: ReactNode;
  className?: string;
  label?: string;
  /** How many components the drawing has (nodes may still be empty while the first layout runs). */
  componentCount?: number;
  /**
   * What the nodes were built from. A big drawing then shows, below OVERVIEW_ZOOM, one overview
   * picture of the whole of it (with the selection, the walk and live wires marked) instead of its nodes.
   */
  overview?: FlowInput;
  /** A layout is on its way: no new overview picture is painted until it lands. */
  layingOut?: boolean;
}

/** The xyflow surface both the editor and the read-only view use. */
export function DrawingCanvas(props: DrawingCanvasProps) {
  const { nodes, edges, readOnly, children, className, label } = props;
  const wrapper = useRef<HTMLDivElement>(null);
  const far = useRef<boolean | null>(null);
  const tiny = useRef<boolean | null>(null);
  const storeApi = useStoreApi<ComponentFlowNode, WireFlowEdge | MateFlowEdge>();
  const flow = useReactFlow<ComponentFlowNode, WireFlowEdge | MateFlowEdge>();
  const big = (props.componentCount ?? nodes.length) > BIG_DRAWING;
  const canOverview = big && !!props.overview;
  // 'overview': the picture instead of the nodes; 'filling': the nodes coming back, a batch a frame.
  // `held`: what xyflow's store holds while the overview is on or the nodes come back (passed to it
  // unchanged meanwhile, so it does not replace what the batches put in).
  const [{ mode, held }, setView] = useState<{ mode: 'nodes' | 'overview' | 'filling'; held: Held }>({ mode: 'nodes', held: NOTHING_HELD });
  const setMode = (next: 'nodes' | 'filling') => setView((v) => ({ mode: next, held: v.held }));
  const overviewOn = useRef(false);
  const { picture, failed: noPicture } = useOverviewPicture(props.overview?.doc, props.overview?.positions, canOverview, props.layingOut);
  // Zoomed out on a big drawing, the overview stands in for the nodes even before its first picture is
  // in (a note says it is being painted): mounting every node at once instead holds the page up for a
  // second or more. Only where no picture can be painted do the nodes stay drawn at every zoom.
  const overviewUsable = canOverview && !noPicture;
  const overviewCanStand = useRef(false);
  // The handlers xyflow gets never change: a new one would re-render every drawn node (all ~800 when
  // zoomed out) each time the page around the drawing re-renders. They call the latest props.
  const latest = useRef(props);
  useLayoutEffect(() => {
    latest.current = props;
  });
  const handlers = useMemo(
    () => ({
      onNodesChange: (c: NodeChange<ComponentFlowNode>[]) => latest.current.onNodesChange?.(c),
      onEdgesChange: (c: EdgeChange<WireFlowEdge | MateFlowEdge>[]) => latest.current.onEdgesChange?.(c),
      onConnect: (c: Connection) => latest.current.onConnect?.(c),
      onReconnect: (old: Edge, c: Connection) => latest.current.onReconnect?.(old, c),
      onNodeDragStart: () => latest.current.onNodeDragStart?.(),
      onNodeDragStop: () => latest.current.onNodeDragStop?.(),
      onNodeClick: (e: React.MouseEvent, n: { id: string }) => latest.current.onNodeClick?.(n.id, e),
      onEdgeClick: (e: React.MouseEvent, ed: { id: string }) => latest.current.onEdgeClick?.(ed.id, e),
      onPaneClick: () => latest.current.onPaneClick?.(),
    }),
    [],
  );
  // Into and out of the overview. xyflow's own store is told at once, in the same task as the zoom
  // step that crosses the threshold: the render that follows then neither mounts the nodes that came
  // into view nor draws the picture and the nodes together. Into it, the store keeps only the nodes
  // drawn until then (hidden under the picture, so none mount as the view grows); they stay mounted,
  // because taking a mounted node out of xyflow's store costs an exception in each of its
  // subscriptions (70 at once held the page up for 80-140 ms). Out of it, the other nodes in view
  // come back a few at a time, nearest the middle of the view first, one batch a frame (each batch
  // one short task rather than one long one for them all); then the nodes out of view, then the
  // other wires, in batches.
  const filling = useRef(0);
  const heldNow = useRef<Held>(NOTHING_HELD);
  const showOverview = useCallback(
    (on: boolean) => {
      if (on === overviewOn.current) return;
      overviewOn.current = on;
      const run = ++filling.current;
      const s = storeApi.getState();
      wrapper.current?.classList.toggle('ww-overview-on', on);
      if (on) {
        const drawn = new Set([...(wrapper.current?.querySelectorAll('.react-flow__node[data-id]') ?? [])].map((el) => el.getAttribute('data-id')!));
        const nodes = [...s.nodeLookup.values()].filter((n) => drawn.has(n.id)).map((n) => n.internals.userNode);
        const edges = s.edges.filter((e) => drawn.has(e.source) && drawn.has(e.target));
        heldNow.current = { nodes, edges };
        s.setNodes(nodes);
        s.setEdges(edges);
        setView({ mode: 'overview', held: heldNow.current });
        return;
      }
      const view = viewOf(s);
      const [cx, cy] = [view.x + view.w / 2, view.y + view.h / 2];
      const all = latest.current.nodes;
      const near = (n: ComponentFlowNode) => nearView(view, n.position.x, n.position.y, n.position.x + (n.width ?? 0), n.position.y + (n.height ?? 0));
      const dist = (n: ComponentFlowNode) => Math.hypot(n.position.x + (n.width ?? 0) / 2 - cx, n.position.y + (n.height ?? 0) / 2 - cy);
      // The nodes still mounted from before the overview are there already, with their wires.
      const present = new Set(heldNow.current.nodes.map((n) => n.id));
      const shown = new Set(heldNow.current.edges.map((e) => e.id));
      const inView = all.filter((n) => !present.has(n.id) && near(n)).sort((a, b) => dist(a) - dist(b));
      // Each batch adds only the wires it completes (found through their ends), not a pass over them all.
      const wiresAt = new Map<string, Array<WireFlowEdge | MateFlowEdge>>();
      for (const e of latest.current.edges) {
        for (const end of [e.source, e.target]) {
          const ends = wiresAt.get(end);
          if (ends) ends.push(e);
          else wiresAt.set(end, [e]);
        }
      }
      let list = heldNow.current.nodes;
      let wires = heldNow.current.edges;
      let at = 0;
      let rest: Array<WireFlowEdge | MateFlowEdge> | null = null;
      const nodeBatches = frameBatches(FRAME_BUDGET_MS, FILL_BATCH, FILL_BATCH * 4);
      const wireBatches = frameBatches(FRAME_BUDGET_MS, FILL_BATCH * 8, FILL_BATCH * 32);
      const step = () => {
        if (run !== filling.current) return;
        const started = performance.now();
        const st = storeApi.getState();
        if (at < inView.length) {
          // The nodes in view, nearest the middle first, and the wires between them.
          const batch = inView.slice(at, at + nodeBatches.size());
          at += batch.length;
          nodeBatches.measure(batch.length, started);
          for (const n of batch) present.add(n.id);
          list = list.concat(batch);
          const added: typeof wires = [];
          for (const n of batch) {
            for (const e of wiresAt.get(n.id) ?? []) {
              if (!shown.has(e.id) && present.has(e.source) && present.has(e.target)) {
                shown.add(e.id);
                added.push(e);
              }
            }
          }
          wires = wires.concat(added);
          st.setNodes(list);
          st.setEdges(wires);
        } else if (!rest) {
          // Every node (those left are out of view: nothing to draw), and the wires still missing: at
          // once those that run clear of the view as it is now (nothing to draw either; each store
          // update re-indexes every wire, so a few big ones beat many small ones), then those that
          // may cross it in batches.
          st.setNodes(latest.current.nodes);
          const now = viewOf(st);
          const box = new Map(latest.current.nodes.map((n) => [n.id, n]));
          const clear = (e: WireFlowEdge | MateFlowEdge) => {
            const a = box.get(e.source);
            const b = box.get(e.target);
            if (!a || !b) return true;
            const left = Math.min(a.position.x, b.position.x);
            const right = Math.max(a.position.x + (a.width ?? 0), b.position.x + (b.width ?? 0));
            const top = Math.min(a.position.y, b.position.y);
            const bottom = Math.max(a.position.y + (a.height ?? 0), b.position.y + (b.height ?? 0));
            return !nearView(now, left, top, right, bottom);
          };
          const missing = latest.current.edges.filter((e) => !shown.has(e.id));
          wires = wires.concat(missing.filter(clear));
          st.setEdges(wires);
          rest = missing.filter((e) => !clear(e));
        } else if (rest.length) {
          // Those wires a batch a frame: long ones to parts out of view may still cross the view.
          const batch = rest.splice(0, wireBatches.size());
          wireBatches.measure(batch.length, started);
          wires = wires.concat(batch);
          st.setEdges(wires);
        } else {
          setMode('nodes');
          return;
        }
        requestAnimationFrame(step);
      };
      setMode('filling');
      step();
    },
    [storeApi],
  );
  // Compact or detailed by a class on the wrapper: crossing the zoom threshold re-renders nothing.
  const onMove: OnMove = useCallback(
    (_e, v) => {
      const c = latest.current;
      showOverview((c.componentCount ?? c.nodes.length) > BIG_DRAWING && !!c.overview && overviewCanStand.current && v.zoom < OVERVIEW_ZOOM);
      const isFar = v.zoom < COMPACT_ZOOM;
      if (isFar !== far.current && wrapper.current) {
        far.current = isFar;
        wrapper.current.classList.toggle('ww-far', isFar);
      }
      const isTiny = v.zoom < TINY_ZOOM;
      if (isTiny !== tiny.current && wrapper.current) {
        tiny.current = isTiny;
        wrapper.current.classList.toggle('ww-tiny', isTiny);
      }
    },
    [showOverview],
  );
  // Whether the overview can stand in changes (a drawing grows big, the painting fails): the view
  // switches then, as a zoom step would.
  useLayoutEffect(() => {
    overviewCanStand.current = overviewUsable;
    onMove(null, flow.getViewport());
  }, [overviewUsable, onMove, flow]);
  const onMoveEnd: OnMove = useCallback((_e, v) => latest.current.onViewportChange?.(v), []);
  const onInit = useCallback((inst: { getViewport: () => Viewport }) => onMove(null, inst.getViewport()), [onMove]);
  const fitViewOptions = useMemo(() => ({ padding: 0.1, maxZoom: 1.2 }), []);
  // A big drawing opens at working zoom on a full stretch of it, so only what is in view is drawn;
  // the fit-view button still shows the whole of it. The pane is not measured yet: the window stands in.
  const [defaultViewport] = useState(() => {
    if (!big) return undefined;
    const boxes = nodes.map((n) => ({ x: n.position.x, y: n.position.y, w: n.width ?? 0, h: n.height ?? 0 }));
    const battery = nodes.find((n) => n.data.component.kind === 'battery') ?? nodes[0];
    const view = { width: Math.max(400, window.innerWidth - 560), height: Math.max(300, window.innerHeight - 160) };
    return openingViewport(boxes, battery ? battery.position : null, view, WORKING_ZOOM);
  });

  // Fit-view for a big drawing: the whole of it from the nodes' boxes (xyflow's own fit-view sees no
  // nodes while the overview is on), the overview switched on before the viewport moves.
  const fit = useCallback(() => {
    const all = latest.current.nodes;
    if (!all.length) return;
    const { width, height } = storeApi.getState();
    const v = getViewportForBounds(getNodesBounds(all), width, height, 0.02, fitViewOptions.maxZoom, fitViewOptions.padding);
    const c = latest.current;
    showOverview((c.componentCount ?? all.length) > BIG_DRAWING && !!c.overview && overviewCanStand.current && v.zoom < OVERVIEW_ZOOM);
    void flow.setViewport(v);
  }, [flow, fitViewOptions, showOverview, storeApi]);
  // A click on the overview zooms in there; the double-click it may be the start of is not taken as
  // xyflow's zoom-in on top of that.
  const zoomedAt = useRef(0);
  const zoomAt = useCallback(
    (x: number, y: number) => {
      zoomedAt.current = performance.now();
      void flow.setCenter(x, y, { zoom: WORKING_ZOOM });
    },
    [flow],
  );
  useLayoutEffect(() => {
    const el = wrapper.current;
    if (!el) return;
    const guard = (e: MouseEvent) => {
      if (performance.now() - zoomedAt.current < 600) e.stopPropagation();
    };
    el.addEventListener('dblclick', guard, true);
    return () => el.removeEventListener('dblclick', guard, true);
  }, []);

  return (
    <div ref={wrapper} className={`ww-drawing h-full w-full${readOnly ? ' ww-readonly' : ''} ${className ?? ''}`} role="region" aria-label={label ?? 'Harness drawing'}>
      <ReactFlow<ComponentFlowNode, WireFlowEdge | MateFlowEdge>
        nodes={mode === 'nodes' ? nodes : held.nodes}
        edges={mode === 'nodes' ? edges : held.edges}
        nodeTypes={nodeTypes}
        edgeTypes={edgeTypes}
        connectionMode={ConnectionMode.Loose}
        onNodesChange={handlers.onNodesChange}
        onEdgesChange={handlers.onEdgesChange}
        onConnect={handlers.onConnect}
        onReconnect={handlers.onReconnect}
        onNodeDragStart={handlers.onNodeDragStart}
        onNodeDragStop={handlers.onNodeDragStop}
        onNodeClick={handlers.onNodeClick}
        onEdgeClick={handlers.onEdgeClick}
        onPaneClick={handlers.onPaneClick}
        onMove={onMove}
        onMoveEnd={onMoveEnd}
        onInit={onInit}
        nodesDraggable={!readOnly}
        nodesConnectable={!readOnly}
        edgesReconnectable={!readOnly}
        elementsSelectable
        deleteKeyCode={null}
        selectionKeyCode="Shift"
        multiSelectionKeyCode={['Meta', 'Control']}
        onlyRenderVisibleElements={big}
        // Low enough for fit-view to show the whole of a ~800-component drawing.
        minZoom={0.02}
        maxZoom={2.5}
        fitView={!defaultViewport}
        defaultViewport={defaultViewport}
        fitViewOptions={fitViewOptions}
        proOptions={{ hideAttribution: true }}
        connectionRadius={24}
      >
        <Controls showInteractive={false} showFitView={!big} position="bottom-left">
          {big ? (
            <ControlButton className="react-flow__controls-fitview" onClick={fit} title="Fit View" aria-label="Fit View">
              <FitIcon />
            </ControlButton>
          ) : null}
        </Controls>
        {canOverview && picture && props.overview ? <DrawingOverview picture={picture} input={props.overview} shown={mode === 'overview'} onZoomAt={zoomAt} /> : null}
        {mode === 'overview' && !picture ? (
          <div className="ww-overview-pending pointer-events-none absolute inset-0 z-10 grid place-items-center" data-overview-pending="">
            <Loading label="Painting the overview of the drawing" />
          </div>
        ) : null}
        {children}
      </ReactFlow>
    </div>
  );
}

/** The fit-view button's mark: four corners. */
function FitIcon() {
  return (
    <svg viewBox="0 0 32 30" aria-hidden="true">
      <path d="M3.7 11.2v-5.1c0-1.3 1.1-2.4 2.4-2.4h5.1V0H6.1A6.1 6.1 0 0 0 0 6.1v5.1h3.7zM20.8 0v3.7h5.1c1.3 0 2.4 1.1 2.4 2.4v5.1H32V6.1A6.1 6.1 0 0 0 25.9 0h-5.1zM28.3 23.9c0 1.3-1.1 2.4-2.4 2.4h-5.1V30h5.1a6.1 6.1 0 0 0 6.1-6.1v-5.1h-3.7v5.1zM6.1 26.3c-1.3 0-2.4-1.1-2.4-2.4v-5.1H0v5.1A6.1 6.1 0 0 0 6.1 30h5.1v-3.7H6.1z" />
    </svg>
  );
}
