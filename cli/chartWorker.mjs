// Worker for cli/chartPng.ts: SVG text in, PNG bytes out, through resvg. It
// runs in its own thread so resvg's native pixel buffers (not seen by the
// garbage collector) are freed when the thread ends after each batch. The
// documents hold their labels as outlines, so resvg is given no font.
import { parentPort, workerData } from 'node:worker_threads';
import { Resvg } from '@resvg/resvg-js';

const { svgs, widthsPx } = workerData;
const out = [];
for (let i = 0; i < svgs.length; i++) {
  const png = new Resvg(svgs[i], {
    fitTo: { mode: 'width', value: widthsPx[i] },
    font: { loadSystemFonts: false },
    background: '#ffffff',
  })
    .render()
    .asPng();
  out.push(new Uint8Array(png));
}
parentPort.postMessage(
  out,
  out.map((b) => b.buffer),
);
