import { memo } from 'react';
import { Position, type Edge, type EdgeProps } from '@xyflow/react';
import type { Wire } from '@shared/harness';
import { clampLabelAt, clampShapes, labelClearOf, pointAlong, wireLabel, wirePaint, wirePath } from '@shared/drawing/wires';
import { SPLICE_HANDLE } from '../flow';
import { ShapeEl } from './ComponentNode';
import { useTiny } from '../zoom';

export interface WireClamp {
  id: string;
  label?: string;
  /** Fraction of the wire's length (default 0.5). */
  at: number;
  /** The clamp is what the side panel shows. */
  focused?: boolean;
}

export interface WireEdgeData extends Record<string, unknown> {
  wire: Wire;
  /** A splice end: the wire leaves its dot in the direction of the other end. */
  sourceSplice?: boolean;
  targetSplice?: boolean;
  onWalk?: boolean;
  /** Clamps on this wire. */
  clamps?: readonly WireClamp[];
}

export type WireFlowEdge = Edge<WireEdgeData, 'wire'>;

const side = (p: Position, splice?: boolean) => (splice ? 'center' : p === Position.Left ? 'left' : 'right');

/** A wire: its IEC 60757 colour, a dashed stripe for a two-colour code, and its id, size and circuit. */
function WireEdgeView({ id, sourceX, sourceY, targetX, targetY, sourcePosition, targetPosition, data, selected }: EdgeProps<WireFlowEdge>) {
  // Zoomed far out only the colours are drawn (see useTiny); hooks come before the early return.
  const tiny = useTiny();
  if (!data) return null;
  const { wire, onWalk } = data;
  // A splice's handle answers its left edge: the wire goes on to the dot's centre.
  const sx = data.sourceSplice ? sourceX + SPLICE_HANDLE / 2 : sourceX;
  const tx = data.targetSplice ? targetX + SPLICE_HANDLE / 2 : targetX;
  const path = wirePath(sx, sourceY, side(sourcePosition, data.sourceSplice), tx, targetY, side(targetPosition, data.targetSplice));
  const paint = wirePaint(wire.color);
  const label = wireLabel(wire);
  const clamps = data.clamps ?? [];
  const clear = clamps.length > 0 && labelClearOf(clamps.map((c) => c.at));
  return (
    <g className={`ww-wire${selected ? ' ww-selected' : ''}${onWalk ? ' ww-on-walk' : ''}`} data-wire={id}>
      {tiny ? null : <path d={path.d} className="ww-wire-hit" />}
      {onWalk || selected ? <path d={path.d} className="ww-wire-glow" /> : null}
      {tiny ? null : <path d={path.d} className="ww-wire-outline" />}
      <path d={path.d} className="ww-wire-base" style={{ stroke: paint.base }} />
      {paint.stripe ? <path d={path.d} className="ww-wire-stripe" style={{ stroke: paint.stripe }} /> : null}
      {tiny ? null : (
        <text x={clear ? path.mx + 10 : path.mx} y={path.my - 7} textAnchor={clear ? 'start' : 'middle'} className="ww-wire-label ww-detail">
          {label}
        </text>
      )}
      {clamps.map((cl) => {
        const p = pointAlong(path, cl.at);
        const t = clampLabelAt(p);
        return (
          <g key={cl.id} className={`ww-clamp${cl.focused ? ' ww-focused' : ''}`} data-clamp={cl.id} aria-label={`clamp ${cl.id}${cl.label ? `, ${cl.label}` : ''}`}>
            <title>{`${cl.id}${cl.label ? `: ${cl.label}` : ''}`}</title>
            <g transform={`translate(${Math.round(p.x * 10) / 10} ${Math.round(p.y * 10) / 10}) rotate(${Math.round(p.angle)})`}>
              {clampShapes.map((s, i) => (
                <ShapeEl key={i} s={s} />
              ))}
            </g>
            {tiny ? null : (
              <text x={t.x} y={t.y} className="ww-clamp-label ww-detail">
                {cl.id}
              </text>
            )}
          </g>
        );
      })}
    </g>
  );
}

export const WireEdge = memo(WireEdgeView);
