/**
 * SVG chart → PNG bytes through resvg (no browser). resvg draws text only
 * with fonts it has loaded, so the font files are found here, on disk, and
 * handed to it by path; a machine with none of them gets a message that says
 * which package to install instead of a chart with blank labels.
 */
import { existsSync } from 'node:fs';
import { Resvg } from '@resvg/resvg-js';
import { renderChartSvg } from '../shared/report/svgChart';
import type { ChartSpec } from '../shared/report/chartSpec';

/** Sans fonts looked for, in order of preference (Debian's fonts-dejavu-core, fonts-liberation). */
const fontCandidates = [
  '/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf',
  '/usr/share/fonts/truetype/dejavu/DejaVuSans-Bold.ttf',
  '/usr/share/fonts/truetype/liberation/LiberationSans-Regular.ttf',
  '/usr/share/fonts/truetype/liberation/LiberationSans-Bold.ttf',
  '/usr/share/fonts/TTF/DejaVuSans.ttf',
  '/usr/share/fonts/TTF/DejaVuSans-Bold.ttf',
  '/Library/Fonts/Arial.ttf',
  '/System/Library/Fonts/Supplemental/Arial.ttf',
  'C:\\Windows\\Fonts\\arial.ttf',
  'C:\\Windows\\Fonts\\arialbd.ttf',
];

let cachedFonts: string[] | null = null;

/**
 * The font files the PNG step will use.
 * @returns absolute paths of the sans fonts found on this machine
 * @throws {Error} when none is found, naming the package that provides one
 */
export function chartFontFiles(): string[] {
  if (cachedFonts) return cachedFonts;
  const found = fontCandidates.filter((f) => existsSync(f));
  if (found.length === 0) {
    throw new Error(
      'No font for chart labels was found (looked for DejaVu Sans, Liberation Sans, Arial). ' +
        'Install one, e.g. "apt-get install fonts-dejavu-core" on Debian or Ubuntu, and run again.',
    );
  }
  cachedFonts = found;
  return found;
}

function familyOf(file: string): string {
  if (/dejavu/i.test(file)) return 'DejaVu Sans';
  if (/liberation/i.test(file)) return 'Liberation Sans';
  return 'Arial';
}

/**
 * Draws a chart as PNG.
 * @param spec - the chart description (display units)
 * @param scale - pixel density: 2 gives a PNG twice the spec's CSS size, sharp in print
 * @returns PNG bytes
 * @throws {Error} when no font can be found (see {@link chartFontFiles})
 */
export function chartPng(spec: ChartSpec, scale = 2): Uint8Array {
  const svg = renderChartSvg(spec);
  const resvg = new Resvg(svg, {
    fitTo: { mode: 'width', value: Math.round(spec.widthPx * scale) },
    font: {
      loadSystemFonts: false,
      fontFiles: chartFontFiles(),
      defaultFontFamily: familyOf(chartFontFiles()[0]),
      sansSerifFamily: familyOf(chartFontFiles()[0]),
    },
    background: '#ffffff',
  });
  return new Uint8Array(resvg.render().asPng());
}
