import { useCallback, useLayoutEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import {
  ConnectionMode,
  Controls,
  ReactFlow,
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
import { openingViewport } from '../geometry';
import { COMPACT_ZOOM, TINY_ZOOM } from '../zoom';

const nodeTypes = { component: ComponentNode };
const edgeTypes = { wire: WireEdge, mate: MateEdge };

/** Above this many components the drawing draws only what is in view. */
export const BIG_DRAWING = 300;

/** The zoom a big drawing opens at: every label readable. */
export const WORKING_ZOOM = 0.8;

export { COMPACT_ZOOM, TINY_ZOOM } from '../zoom';

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
}

/** The xyflow surface both the editor and the read-only view use. */
export function DrawingCanvas(props: DrawingCanvasProps) {
  const { nodes, edges, readOnly, children, className, label } = props;
  const wrapper = useRef<HTMLDivElement>(null);
  const far = useRef<boolean | null>(null);
  const tiny = useRef<boolean | null>(null);
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
  // Compact or detailed by a class on the wrapper: crossing the zoom threshold re-renders nothing.
  const onMove: OnMove = useCallback(
    (_e, v) => {
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
    [],
  );
  const onMoveEnd: OnMove = useCallback((_e, v) => latest.current.onViewportChange?.(v), []);
  const onInit = useCallback((inst: { getViewport: () => Viewport }) => onMove(null, inst.getViewport()), [onMove]);
  const big = (props.componentCount ?? nodes.length) > BIG_DRAWING;
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

  return (
    <div ref={wrapper} className={`ww-drawing h-full w-full${readOnly ? ' ww-readonly' : ''} ${className ?? ''}`} role="region" aria-label={label ?? 'Harness drawing'}>
      <ReactFlow<ComponentFlowNode, WireFlowEdge | MateFlowEdge>
        nodes={nodes}
        edges={edges}
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
        <Controls showInteractive={false} position="bottom-left" />
        {children}
      </ReactFlow>
    </div>
  );
}
