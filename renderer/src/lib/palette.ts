/**
 * Plotrate's chart palette. Chosen so neighbouring series differ in lightness
 * as well as hue (they stay apart for the common red–green colour-vision
 * deficiencies and in greyscale print); charts also vary marker shape and dash,
 * so colour is never the only cue.
 */

/** Series colours in the order charts use them. */
export const SERIES_COLOURS = [
  '#1d6f78', // deep teal
  '#e0a030', // amber
  '#4b4fa6', // indigo
  '#c0557a', // rose
  '#5aa7d6', // sky
  '#7d5a2c', // umber
  '#8f8f8f', // stone
] as const;

/** Marker shapes, one per block, so blocks read without colour. */
export const BLOCK_SYMBOLS = [
  'circle',
  'square',
  'diamond',
  'triangle-up',
  'x',
  'star',
  'hexagon',
] as const;

/** Line dashes for fitted curves, one per model. */
export const CURVE_DASHES = ['solid', 'dash', 'dot', 'dashdot', 'longdash', 'longdashdot'] as const;

/** Page colours shared by the charts and the stylesheet. */
export const INK = '#1f2a30';
export const MUTED = '#5b6770';
export const GRID = '#dde3e6';
/** The optimum-interval band. */
export const BAND = 'rgba(224, 160, 48, 0.22)';

/**
 * The colour of series i, cycling.
 * @param i - 0-based series index
 * @returns a hex colour
 * @example
 * seriesColour(1) // '#e0a030'
 */
export function seriesColour(i: number): string {
  return SERIES_COLOURS[
    ((i % SERIES_COLOURS.length) + SERIES_COLOURS.length) % SERIES_COLOURS.length
  ];
}
