/// <reference lib="webworker" />
/**
 * Paints the overview picture of a big drawing off the main thread, at each of
 * its scales, and hands the bitmaps back without a copy.
 */
import type { HarnessDocument } from '@shared/harness';
import type { Positions } from '@shared/drawing/geometry';
import { overviewLevels, overviewScene, paintOverview, type OverviewRaster } from './overview';

export interface OverviewRequest {
  requestId: number;
  doc: HarnessDocument;
  positions: Positions;
  /** Bitmap pixels per drawing unit wanted at most. */
  sharpScale: number;
}

export type OverviewAnswer =
  | { requestId: number; ok: true; levels: Array<{ bitmap: ImageBitmap; raster: OverviewRaster }>; ms: number }
  | { requestId: number; ok: false; message: string };

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = (event: MessageEvent<OverviewRequest>) => {
  const { requestId, doc, positions, sharpScale } = event.data;
  const started = performance.now();
  try {
    const scene = overviewScene(doc, positions);
    const levels = overviewLevels(scene.bounds, sharpScale).map((raster) => {
      const canvas = new OffscreenCanvas(raster.width, raster.height);
      const g = canvas.getContext('2d');
      if (!g) throw new Error('This browser cannot paint off the page (no OffscreenCanvas 2D).');
      paintOverview(g, scene, raster);
      return { bitmap: canvas.transferToImageBitmap(), raster };
    });
    const answer: OverviewAnswer = { requestId, ok: true, levels, ms: performance.now() - started };
    scope.postMessage(answer, levels.map((l) => l.bitmap));
  } catch (error) {
    scope.postMessage({ requestId, ok: false, message: error instanceof Error ? error.message : String(error) } satisfies OverviewAnswer);
  }
};
