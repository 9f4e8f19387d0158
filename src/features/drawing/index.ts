/**
 * The harness drawing: the public surface of the feature.
 *
 * - `HarnessDrawing`: a read-only view (document, positions, highlight, markers, onViewportChange).
 *   It pulls in @xyflow/react: import it lazily (React.lazy) in pages that do not always show it.
 * - `renderDrawingSvg`: the same drawing as an SVG string, without any DOM (also for the server).
 * - Route modules: `/harnesses` and `/harnesses/:harnessId/drawing` (registered in src/app/routes.ts).
 */
export { HarnessDrawing, type HarnessDrawingProps } from './components/HarnessDrawing';
export { renderDrawingSvg, type Highlight, type Marker, type SvgOptions } from '@shared/drawing/svg';
export type { Positions, Point } from '@shared/drawing/geometry';
