import { memo } from 'react';
import { Position, type Edge, type EdgeProps } from '@xyflow/react';
import type { Wire } from '@shared/harness';
import { wireLabel, wirePaint, wirePath } from '../wires';
import { SPLICE_HANDLE } from '../flow';

export interface WireEdgeData extends Record<string, unknown> {
  wire: Wire;
  /** A splice end: the wire leaves its dot in the direction of the other end. */
  sourceSplice?: boolean;
  targetSplice?: boolean;
  onWalk?: boolean;
}

export type WireFlowEdge = Edge<WireEdgeData, 'wire'>;

const side = (p: Position, splice?: boolean) => (splice ? 'center' : p === Position.Left ? 'left' : 'right');

/** A wire: its IEC 60757 colour, a dashed stripe for a two-colour code, and its id, size and circuit. */
function WireEdgeView({ id, sourceX, sourceY, targetX, targetY, sourcePosition, targetPosition, data, selected }: EdgeProps<WireFlowEdge>) {
  if (!data) return null;
  const { wire, onWalk } = data;
  // A splice's handle answers its left edge: the wire goes on to the dot's centre.
  const sx = data.sourceSplice ? sourceX + SPLICE_HANDLE / 2 : sourceX;
  const tx = data.targetSplice ? targetX + SPLICE_HANDLE / 2 : targetX;
  const path = wirePath(sx, sourceY, side(sourcePosition, data.sourceSplice), tx, targetY, side(targetPosition, data.targetSplice));
  const paint = wirePaint(wire.color);
  const label = wireLabel(wire);
  return (
    <g className={`ww-wire${selected ? ' ww-selected' : ''}${onWalk ? ' ww-on-walk' : ''}`} data-wire={id}>
      <path d={path.d} className="ww-wire-hit" />
      {onWalk || selected ? <path d={path.d} className="ww-wire-glow" /> : null}
      <path d={path.d} className="ww-wire-outline" />
      <path d={path.d} className="ww-wire-base" style={{ stroke: paint.base }} />
      {paint.stripe ? <path d={path.d} className="ww-wire-stripe" style={{ stroke: paint.stripe }} /> : null}
      <text x={path.mx} y={path.my - 7} textAnchor="middle" className="ww-wire-label ww-detail">
        {label}
      </text>
    </g>
  );
}

export const WireEdge = memo(WireEdgeView);
