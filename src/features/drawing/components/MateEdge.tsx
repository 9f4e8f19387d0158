import { memo } from 'react';
import type { Edge, EdgeProps } from '@xyflow/react';

export type MateFlowEdge = Edge<Record<string, unknown>, 'mate'>;

/** Two halves of a connector, mated: a double bar between their mating faces. */
function MateEdgeView({ sourceX, sourceY, targetX, targetY }: EdgeProps<MateFlowEdge>) {
  const d = `M${sourceX} ${sourceY - 3}L${targetX} ${targetY - 3}M${sourceX} ${sourceY + 3}L${targetX} ${targetY + 3}`;
  return <path d={d} className="ww-mate" />;
}

export const MateEdge = memo(MateEdgeView);
