/**
 * SVG chart → PNG bytes through resvg (no browser). The labels are written as
 * glyph outlines from the chart fonts (outlinedText.ts), so the documents hold
 * no text and resvg is given no font: loading the two font files into every
 * picture cost 0.6–1.6 ms each and changed no pixel (measured on 60 charts).
 */
import { chartFontFiles } from './chartFonts';
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { Resvg } from '@resvg/resvg-js';
import { chartScene } from '../shared/report/chartScene';
import { sceneSvg } from '../shared/report/svgChart';
import { outlinedTextWriter } from './outlinedText';
import type { ChartSpec } from '../shared/report/chartSpec';

/** The chart as SVG with its labels as glyph outlines (see outlinedText.ts). */
function outlinedSvg(spec: ChartSpec): string {
  return sceneSvg(chartScene(spec), undefined, outlinedTextWriter());
}

/**
 * Draws a chart as PNG.
 * @param spec - the chart description (display units)
 * @param scale - pixel density: 2 gives a PNG twice the spec's CSS size, sharp in print
 * @returns PNG bytes
 * @throws {Error} when no font can be found (see {@link chartFontFiles})
 */
export function chartPng(spec: ChartSpec, scale = 2): Uint8Array {
  const svg = outlinedSvg(spec);
  const resvg = new Resvg(svg, {
    fitTo: { mode: 'width', value: Math.round(spec.widthPx * scale) },
    font: { loadSystemFonts: false },
    background: '#ffffff',
  });
  return new Uint8Array(resvg.render().asPng());
}

/** Charts drawn per worker thread before it is ended and its memory returned. */
const BATCH = 24;

/**
 * Draws many charts as PNG in worker threads (one per core), a batch at a time. resvg keeps
 * its pixel buffers outside the JavaScript heap, where the collector does not
 * see them (measured here: about 8 MB kept per 1600 px chart, gigabytes for a
 * thousand sites); ending the thread after each batch gives that memory back.
 * @param specs - the charts (display units)
 * @param scale - pixel density, as for {@link chartPng}
 * @param onBatch - called as each batch is drawn: the number drawn so far (for progress), the
 *   batch's first index in `specs` and its pictures (for a caller that uses them at once)
 * @returns PNG bytes in the order of `specs`
 * @throws {Error} when no font can be found
 */
export async function chartPngs(
  specs: readonly ChartSpec[],
  scale = 2,
  onBatch?: (done: number, first: number, pngs: readonly Uint8Array[]) => void,
): Promise<Uint8Array[]> {
  chartFontFiles(); // the labels' outlines need a font: said before any worker starts
  const worker = new URL('./chartWorker.mjs', import.meta.url);
  const draw = (batch: readonly ChartSpec[]): Promise<Uint8Array[]> =>
    new Promise<Uint8Array[]>((resolve, reject) => {
      const w = new Worker(worker, {
        workerData: {
          svgs: batch.map(outlinedSvg),
          widthsPx: batch.map((s) => Math.round(s.widthPx * scale)),
        },
      });
      w.once('message', (m: Uint8Array[]) => {
        resolve(m);
        void w.terminate();
      });
      w.once('error', reject);
      w.once('exit', (code) => {
        if (code !== 0 && code !== 1)
          reject(new Error(`The chart worker stopped with code ${code}.`));
      });
    });
  const batches: ChartSpec[][] = [];
  for (let i = 0; i < specs.length; i += BATCH) batches.push(specs.slice(i, i + BATCH));
  const results: Uint8Array[][] = new Array(batches.length);
  // A thread per core: drawing is most of a big run's work. The main thread writes the PDF and
  // the workbook's sheets meanwhile; on 2 cores, 2 threads drew 1,000 sites' outputs in
  // 32.7–34.1 s against 36.6–37.7 with one (more system time, about 100 MB more memory).
  const lanes = Math.max(1, Math.min(availableParallelism(), batches.length));
  let next = 0;
  let done = 0;
  await Promise.all(
    Array.from({ length: lanes }, async () => {
      while (next < batches.length) {
        const k = next++;
        results[k] = await draw(batches[k]);
        done += results[k].length;
        onBatch?.(done, k * BATCH, results[k]);
      }
    }),
  );
  return results.flat();
}
