import { useMemo } from 'react';
import { ReactFlowProvider, type Viewport } from '@xyflow/react';
import type { HarnessDocument } from '@shared/harness';
import { fillPositions, type Positions } from '@shared/drawing/geometry';
import { useFlowElements } from '../flow';
import type { Highlight, Marker } from '@shared/drawing/svg';
import { DrawingCanvas } from './DrawingCanvas';

export interface HarnessDrawingProps {
  document: HarnessDocument;
  positions: Positions;
  highlight?: Highlight;
  markers?: Marker[];
  /** Expected volts by pin ref, shown beside every pin. */
  volts?: ReadonlyMap<string, number | null> | null;
  onViewportChange?: (viewport: Viewport) => void;
  onSelect?: (ref: { kind: 'component' | 'wire'; id: string }) => void;
  className?: string;
}

/**
 * The drawing, read only: pan, zoom, click to pick; the highlighted path (pins
 * and wires) in the accent colour; markers listed in a key below the drawing.
 */
export function HarnessDrawing({ document, positions, highlight, markers, volts, onViewportChange, onSelect, className }: HarnessDrawingProps) {
  const pos = useMemo(() => fillPositions(document, positions ?? {}), [document, positions]);
  const highlightPins = useMemo(() => new Set(highlight?.pins ?? []), [highlight?.pins]);
  const highlightWires = useMemo(() => new Set(highlight?.wires ?? []), [highlight?.wires]);
  const markedComponents = useMemo(() => new Set((markers ?? []).flatMap((m) => (m.ref ? [m.ref.split('.')[0]] : []))), [markers]);
  const flowInput = { doc: document, positions: pos, highlightPins, highlightWires, problemComponents: markedComponents, volts, readOnly: true };
  const { nodes, edges } = useFlowElements(flowInput);
  return (
    <div className={`flex h-full min-h-80 flex-col ${className ?? ''}`}>
      <div className="min-h-0 flex-1">
        <ReactFlowProvider>
          <DrawingCanvas
            nodes={nodes}
            edges={edges}
            readOnly
            overview={flowInput}
            onViewportChange={onViewportChange}
            onNodeClick={onSelect ? (id) => onSelect({ kind: 'component', id }) : undefined}
            onEdgeClick={onSelect ? (id) => onSelect({ kind: 'wire', id }) : undefined}
            label={`Drawing of ${document.name} (read only)`}
          />
        </ReactFlowProvider>
      </div>
      {markers?.length ? (
        <ol className="flex flex-wrap gap-x-6 gap-y-1 border-t border-line px-3 py-2 text-sm">
          {markers.map((m, i) => (
            <li key={`${m.ref ?? ''}-${i}`}>
              <span className="font-bold text-accent">{i + 1}</span> {m.ref ? `${m.ref}: ` : ''}{m.label}
            </li>
          ))}
        </ol>
      ) : null}
    </div>
  );
}
