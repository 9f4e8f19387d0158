/**
 * The harness drawing: the public surface of the feature.
 *
 * - `HarnessDrawing`: a read-only view (document, positions, highlight, markers, onViewportChange).
 *   It pulls in @xyflow/react: import it lazily (React.lazy) in pages that do not always show it.
 * - Route modules: `/harnesses` and `/harnesses/:harnessId/drawing` (registered in src/app/routes.ts).
 *
 * The framework-free drawing (geometry, symbols, wires, layout graph, the SVG renderer) is in
 * shared/drawing, for the server's report as much as for this feature.
 */
export { HarnessDrawing, type HarnessDrawingProps } from './components/HarnessDrawing';
