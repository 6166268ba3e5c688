/**
 * A neutral description of a chart: what to draw, in display units, with no
 * drawing library in it. Two renderers read it: the screen draws it with
 * Plotly (renderer/) and the reports lay it out once (chartScene.ts) and write
 * it as SVG (svgChart.ts; PNG in the workbook) or as PDF vectors (cli/).
 * Keeping the description apart means the workbook, the PDF and the screen
 * show the same points, curves and bands.
 *
 * Conventions every renderer follows:
 * - All numbers are in the units named on the axes (the caller converts from
 *   canonical kg/ha with shared/units before building a spec).
 * - A chart is a stack of panels sharing the width; `heightShare` splits the
 *   height (e.g. response 3, residuals 1).
 * - Layers draw in array order (bands first, then curves, then points, then
 *   markers), so a builder puts them in the order it wants them seen.
 * - Colors are not in the spec: a layer carries a `role` (and points a
 *   `groupIndex`), and {@link chartPalette} maps those to colors, so both
 *   renderers agree without the spec fixing a look.
 */
import type { ModelName } from '../models/modelTypes';

/** The response models a curve layer can stand for: the models stage's own names. */
export type ChartModelName = ModelName;

/** One axis: its title with the unit, and an optional fixed range. */
export interface ChartAxis {
  /** What the axis measures, e.g. "N rate". */
  title: string;
  /** Unit shown after the title in parentheses, e.g. "lb N/ac"; "" for none. */
  unit: string;
  /** Lower end of the range in axis units; omitted = fit the data. */
  min?: number;
  /** Upper end of the range in axis units; omitted = fit the data. */
  max?: number;
  /** Draw a line at zero across the panel (residual panels). */
  zeroLine?: boolean;
}

/**
 * Observed plots as markers, one layer per block so each block has its own
 * marker and legend entry. Excluded plots go in their own layer with
 * `excluded: true` (drawn hollow, never used for fitting).
 */
export interface PointLayer {
  kind: 'points';
  /** Legend text, e.g. "Block 2" or "Excluded". */
  name: string;
  /** 0-based index of the group (block) for marker shape and color. */
  groupIndex: number;
  /** Rates, x-axis units. */
  x: number[];
  /** Yields (or residuals), y-axis units; same length as `x`. */
  y: number[];
  /** Hover/tooltip text per point (plot label, cell address); same length or omitted. */
  labels?: string[];
  /** True for plots left out of the fit. */
  excluded?: boolean;
  /** True for a ring around plots whose value the user corrected (drawn over their own marker). */
  corrected?: boolean;
}

/** A fitted curve sampled densely enough to draw as a polyline. */
export interface CurveLayer {
  kind: 'curve';
  /** Legend text, e.g. "Quadratic-plateau (leading)". */
  name: string;
  /** The model this curve comes from; null for a curve that is not a model fit. */
  model: ChartModelName | null;
  /**
   * "chosen" is drawn bold; "alternative" thin; "return" is an economic return curve; "risk" a
   * share in percent (how often a rate falls short), drawn in its own color.
   */
  role: 'chosen' | 'alternative' | 'return' | 'risk';
  /**
   * For an alternative curve that belongs to a group of points (a treatment level's curve over
   * its plots): drawn in that group's color, so the curve is read against its own points.
   */
  groupIndex?: number;
  /** x values in axis units, increasing. */
  x: number[];
  /** y values in axis units; same length as `x`. */
  y: number[];
}

/**
 * A vertical band across the panel from `low` to `high` on the x axis: the
 * optimum rate's interval, or the profitable range of the regional curve.
 */
export interface RateBandLayer {
  kind: 'band';
  name: string;
  role: 'optimumInterval' | 'profitableRange';
  /** Lower edge, x-axis units. */
  low: number;
  /** Upper edge, x-axis units. */
  high: number;
}

/**
 * A shaded ribbon between two lines over the same x values: how far a curve could move (a
 * pointwise interval), e.g. the regional mean return over resampled site-years.
 */
export interface RibbonLayer {
  kind: 'ribbon';
  name: string;
  role: 'returnBand';
  /** x values in axis units, increasing. */
  x: number[];
  /** Lower edge at each x, y-axis units. */
  low: number[];
  /** Upper edge at each x, y-axis units. */
  high: number[];
}

/** A vertical line at one x value with a short label: the optimum or best rate. */
export interface RateMarkerLayer {
  kind: 'marker';
  name: string;
  role: 'optimumRate' | 'bestRate';
  /** Position, x-axis units. */
  x: number;
  /** Short label drawn next to the line, e.g. "EONR 152". */
  label: string;
}

/** Any layer of a panel. */
export type ChartLayer = PointLayer | CurveLayer | RateBandLayer | RibbonLayer | RateMarkerLayer;

/** One panel: its own axes and layers. Panels of a chart share the width. */
export interface ChartPanel {
  /** Stable key, e.g. "response", "residuals", "return". */
  id: string;
  /** Panel title; "" for none. */
  title: string;
  x: ChartAxis;
  y: ChartAxis;
  /** Relative height of this panel among the chart's panels (> 0). */
  heightShare: number;
  layers: ChartLayer[];
}

/** A whole chart: a title, one or more panels and a suggested size. */
export interface ChartSpec {
  /** Heading above the panels, e.g. "Maple Hollow 2025: yield response to N". */
  title: string;
  /** A smaller second line (model, price ratio); "" for none. */
  subtitle: string;
  /** Suggested drawing size in CSS pixels (the PNG is drawn at a multiple of it). */
  widthPx: number;
  heightPx: number;
  panels: ChartPanel[];
  /** Text under the chart (data source, what the band means); "" for none. */
  note: string;
}

/**
 * The colors and marker shapes both renderers use for roles and groups.
 * Chosen to stay apart for the common color-vision deficiencies (blue /
 * orange / grey contrasts rather than red against green).
 */
export const chartPalette = {
  /** Marker colors for blocks, cycled by `groupIndex`. */
  groups: ['#1f5fa8', '#d9731a', '#2a8c6f', '#8a4fa3', '#b5475b', '#5b6770'],
  /** Marker shapes for blocks, cycled by `groupIndex`. */
  symbols: ['circle', 'square', 'triangle', 'diamond', 'cross', 'star'] as const,
  excluded: '#9a9a9a',
  chosen: '#111111',
  alternative: '#8c8c8c',
  return: '#1f5fa8',
  optimumInterval: 'rgba(217, 115, 26, 0.18)',
  profitableRange: 'rgba(42, 140, 111, 0.18)',
  returnBand: 'rgba(31, 95, 168, 0.16)',
  corrected: '#c2410c',
  risk: '#b5475b',
  optimumRate: '#d9731a',
  bestRate: '#2a8c6f',
  grid: '#e4e4e4',
  axis: '#333333',
} as const;

/** A marker shape name from {@link chartPalette}.symbols. */
export type ChartSymbol = (typeof chartPalette.symbols)[number];

/**
 * Axis title with its unit, the way every renderer writes it.
 * @param axis - the axis
 * @returns "N rate (lb N/ac)", or the bare title when there is no unit
 * @example
 * axisLabel({ title: 'Yield', unit: 'bu/ac' }) // "Yield (bu/ac)"
 */
export function axisLabel(axis: ChartAxis): string {
  return axis.unit ? `${axis.title} (${axis.unit})` : axis.title;
}
