import { useCallback, useMemo, useRef, type ReactNode } from 'react';
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

const nodeTypes = { component: ComponentNode };
const edgeTypes = { wire: WireEdge, mate: MateEdge };

/** Below this zoom the drawing is compact: no captions, no wire labels. */
export const COMPACT_ZOOM = 0.55;

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
}

/** The xyflow surface both the editor and the read-only view use. */
export function DrawingCanvas(props: DrawingCanvasProps) {
  const { nodes, edges, readOnly, onViewportChange, children, className, label } = props;
  const wrapper = useRef<HTMLDivElement>(null);
  const far = useRef<boolean | null>(null);
  // Compact or detailed by a class on the wrapper: crossing the zoom threshold re-renders nothing.
  const onMove: OnMove = useCallback(
    (_e, v) => {
      const isFar = v.zoom < COMPACT_ZOOM;
      if (isFar !== far.current && wrapper.current) {
        far.current = isFar;
        wrapper.current.classList.toggle('ww-far', isFar);
      }
    },
    [],
  );
  const onMoveEnd: OnMove = useCallback((_e, v) => onViewportChange?.(v), [onViewportChange]);
  const onInit = useCallback((inst: { getViewport: () => Viewport }) => onMove(null, inst.getViewport()), [onMove]);
  const big = nodes.length > 300;
  const fitViewOptions = useMemo(() => ({ padding: 0.1, maxZoom: 1.2 }), []);

  return (
    <div ref={wrapper} className={`ww-drawing h-full w-full${readOnly ? ' ww-readonly' : ''} ${className ?? ''}`} role="region" aria-label={label ?? 'Harness drawing'}>
      <ReactFlow<ComponentFlowNode, WireFlowEdge | MateFlowEdge>
        nodes={nodes}
        edges={edges}
        nodeTypes={nodeTypes}
        edgeTypes={edgeTypes}
        connectionMode={ConnectionMode.Loose}
        onNodesChange={props.onNodesChange}
        onEdgesChange={props.onEdgesChange}
        onConnect={props.onConnect}
        onReconnect={props.onReconnect}
        onNodeDragStart={props.onNodeDragStart}
        onNodeDragStop={props.onNodeDragStop}
        onNodeClick={props.onNodeClick ? (e, n) => props.onNodeClick!(n.id, e) : undefined}
        onEdgeClick={props.onEdgeClick ? (e, ed) => props.onEdgeClick!(ed.id, e) : undefined}
        onPaneClick={props.onPaneClick}
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
        minZoom={0.05}
        maxZoom={2.5}
        fitView
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
