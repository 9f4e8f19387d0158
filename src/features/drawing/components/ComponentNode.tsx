import { memo } from 'react';
import { Handle, Position, type Node, type NodeProps } from '@xyflow/react';
import type { Component } from '@shared/harness';
import type { MateRole, NodeGeom } from '@shared/drawing/geometry';
import { componentDrawing, type Paint, type Shape, type TextItem } from '@shared/drawing/symbols';
import { useTiny } from '../zoom';

export interface ComponentNodeData extends Record<string, unknown> {
  component: Component;
  geom: NodeGeom;
  mate: MateRole;
  /** Expected volts per pin id in the picked state (null: floating). */
  volts?: Record<string, number | null>;
  /** Pins on the walked path. */
  hlPins?: readonly string[];
  /** The validator found a problem here. */
  problem?: boolean;
}

export type ComponentFlowNode = Node<ComponentNodeData, 'component'>;

const paint: Record<Paint, string> = {
  ink: 'var(--ww-ink)',
  muted: 'var(--ww-ink-muted)',
  surface: 'var(--ww-surface)',
  sunken: 'var(--ww-sunken)',
  none: 'none',
  accent: 'var(--ww-accent)',
};

export function ShapeEl({ s }: { s: Shape }) {
  const common = { stroke: s.stroke ? paint[s.stroke] : 'none', fill: s.fill ? paint[s.fill] : 'none', strokeWidth: s.sw ?? 1, strokeLinejoin: 'round' as const, strokeLinecap: 'round' as const };
  switch (s.t) {
    case 'path': return <path d={s.d} {...common} />;
    case 'rect': return <rect x={s.x} y={s.y} width={s.w} height={s.h} rx={s.rx} {...common} />;
    case 'circle': return <circle cx={s.cx} cy={s.cy} r={s.r} {...common} />;
  }
}

function TextEl({ t }: { t: TextItem }) {
  if (!t.text) return null;
  return (
    <text x={t.x} y={t.y} textAnchor={t.anchor} className={`ww-t-${t.role}${t.detail ? ' ww-detail' : ''}`}>
      {t.text}
    </text>
  );
}

export function voltsText(v: number | null | undefined): string {
  if (v === undefined) return '';
  if (v === null) return 'open';
  if (Math.abs(v) < 0.005) return '0.00 V';
  return `${v.toFixed(Math.abs(v) >= 100 ? 0 : 2)} V`;
}

/** One component of the harness: its symbol or box, and a handle per pin in cavity order. */
function ComponentNodeView({ id, data, selected }: NodeProps<ComponentFlowNode>) {
  const { component, geom, mate, volts, hlPins, problem } = data;
  const drawing = componentDrawing(component, geom, mate);
  const hl = hlPins ? new Set(hlPins) : null;
  const splice = component.kind === 'splice';
  // Zoomed far out no text can be read: it is left out, not just hidden, so mounting is cheap.
  const tiny = useTiny();
  return (
    <div
      className={`ww-node${selected ? ' ww-selected' : ''}${problem ? ' ww-problem' : ''}${hl?.size ? ' ww-on-walk' : ''}`}
      style={{ width: geom.width, height: geom.height }}
      data-kind={component.kind}
      data-component={id}
      aria-label={`${component.kind} ${id}${component.label ? `, ${component.label}` : ''}`}
    >
      <svg width={geom.width} height={geom.height} overflow="visible" className="ww-node-svg" aria-hidden="true">
        {drawing.shapes.map((s, i) => (
          <ShapeEl key={i} s={s} />
        ))}
        {tiny
          ? null
          : drawing.texts.map((t, i) => (
              <TextEl key={i} t={t} />
            ))}
        {volts && !tiny
          ? geom.ports.map((p) => (
              <text
                key={`v${p.pin}`}
                x={splice ? p.x : p.side === 'left' ? p.x - 6 : p.x + 6}
                y={splice ? p.y + 22 : p.y - 6}
                textAnchor={splice ? 'middle' : p.side === 'left' ? 'end' : 'start'}
                className="ww-t-volts"
                data-pin={`${id}.${p.pin}`}
              >
                {voltsText(volts[p.pin])}
              </text>
            ))
          : null}
        {hl
          ? geom.ports.filter((p) => hl.has(p.pin)).map((p) => <circle key={`h${p.pin}`} cx={p.x} cy={p.y} r={8} className="ww-walk-dot" />)
          : null}
      </svg>
      {geom.ports.map((p) => (
        <Handle
          key={p.pin}
          id={p.pin}
          type="source"
          position={p.side === 'left' ? Position.Left : Position.Right}
          className="ww-handle"
          style={splice ? { top: p.y, left: p.x, right: 'auto' } : { top: p.y }}
          title={`${id}.${p.pin}`}
          aria-label={`pin ${id}.${p.pin}`}
        />
      ))}
      {mate ? (
        <Handle
          id={MATE_HANDLE}
          type="source"
          position={mate === 'a' ? Position.Right : Position.Left}
          isConnectable={false}
          className="ww-mate-handle"
          style={{ top: 14 }}
        />
      ) : null}
    </div>
  );
}

/** The hidden handle on a connector half's mating face, where the pair's mate bar starts. */
export const MATE_HANDLE = '__mate';

export const ComponentNode = memo(ComponentNodeView);
