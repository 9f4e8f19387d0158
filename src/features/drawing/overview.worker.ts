/// <reference lib="webworker" />
/**
 * Paints the overview picture of a big drawing off the main thread and hands it
 * back as a PNG (a Blob: passed by reference, not copied).
 */
import type { HarnessDocument } from '@shared/harness';
import type { Positions } from '@shared/drawing/geometry';
import { overviewRaster, overviewScene, paintOverview, type OverviewRaster } from './overview';

export interface OverviewRequest {
  requestId: number;
  doc: HarnessDocument;
  positions: Positions;
  /** Bitmap pixels per drawing unit wanted at most. */
  sharpScale: number;
}

export type OverviewAnswer =
  | { requestId: number; ok: true; png: Blob; raster: OverviewRaster; ms: number }
  | { requestId: number; ok: false; message: string };

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = async (event: MessageEvent<OverviewRequest>) => {
  const { requestId, doc, positions, sharpScale } = event.data;
  const started = performance.now();
  try {
    const scene = overviewScene(doc, positions);
    const raster = overviewRaster(scene.bounds, sharpScale);
    const canvas = new OffscreenCanvas(raster.width, raster.height);
    const g = canvas.getContext('2d');
    if (!g) throw new Error('This browser cannot paint off the page (no OffscreenCanvas 2D).');
    paintOverview(g, scene, raster);
    const png = await canvas.convertToBlob({ type: 'image/png' });
    scope.postMessage({ requestId, ok: true, png, raster, ms: performance.now() - started } satisfies OverviewAnswer);
  } catch (error) {
    scope.postMessage({ requestId, ok: false, message: error instanceof Error ? error.message : String(error) } satisfies OverviewAnswer);
  }
};
