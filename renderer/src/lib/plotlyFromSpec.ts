/**
 * Turns the engine's neutral chart description (shared/report/chartSpec) into
 * Plotly's data and layout. Only drawing decisions live here — which axis a
 * panel gets, how a band or a marker is drawn — never a number the engine did
 * not compute. Colors come from the shared chartPalette so the screen and the
 * printed reports look alike.
 */
import { MODEL_CURVES } from '../../../shared/models/curves';
import {
  axisLabel,
  chartPalette,
  type ChartAxis,
  type ChartModelName,
  type ChartPanel,
  type ChartSpec,
} from '../../../shared/report/chartSpec';

/** Plotly's data and layout for one chart. */
export interface PlotlyFigure {
  data: Record<string, unknown>[];
  layout: Record<string, unknown>;
}

export interface FigureOptions {
  /**
   * Color alternative curves by their order (shared palette, with the model's
   * dash), for charts where each curve is its own site rather than a rival fit.
   */
  colorCurves?: boolean;
}

/** Plotly's names for the shared palette's marker shapes. */
const plotlySymbols: Record<(typeof chartPalette.symbols)[number], string> = {
  circle: 'circle',
  square: 'square',
  triangle: 'triangle-up',
  diamond: 'diamond',
  cross: 'cross',
  star: 'star',
};

/**
 * The model's own dash (its curve entry's, shared with the printed charts), so
 * alternative curves are told apart without color; Plotly takes lengths as "9px,9px".
 */
function modelDash(model: ChartModelName): string {
  return MODEL_CURVES[model].dash
    .split(' ')
    .map((length) => `${length}px`)
    .join(',');
}

/** Gap between stacked panels, as a share of the plot height. */
const PANEL_GAP = 0.12;

/** Axis names for panel i: 'x'/'y' for the first, 'x2'/'y2' for the second… */
function axisIds(i: number): { x: string; y: string; xKey: string; yKey: string } {
  const n = i === 0 ? '' : String(i + 1);
  return { x: `x${n}`, y: `y${n}`, xKey: `xaxis${n}`, yKey: `yaxis${n}` };
}

/** Vertical domains of the panels, top to bottom, split by heightShare. */
function panelDomains(panels: readonly ChartPanel[]): [number, number][] {
  const total = panels.reduce((s, p) => s + p.heightShare, 0);
  const usable = 1 - PANEL_GAP * (panels.length - 1);
  const domains: [number, number][] = [];
  let top = 1;
  for (const panel of panels) {
    const height = (panel.heightShare / total) * usable;
    domains.push([Math.max(0, top - height), top]);
    top -= height + PANEL_GAP;
  }
  return domains;
}

function axisLayout(axis: ChartAxis, extra: Record<string, unknown>): Record<string, unknown> {
  const range = axis.min !== undefined && axis.max !== undefined ? [axis.min, axis.max] : undefined;
  return {
    title: { text: axisLabel(axis) },
    gridcolor: chartPalette.grid,
    linecolor: chartPalette.axis,
    zeroline: axis.zeroLine ?? false,
    zerolinecolor: chartPalette.axis,
    automargin: true,
    // Plotly's default hides a tick label that overflows the figure, which it finds by measuring
    // every label (a forced layout each); automargin already makes room for them. On the all-sites
    // step at 500 sites the measuring was about 9 ms of each price change's redraw.
    ticklabeloverflow: 'allow',
    ...(range ? { range } : {}),
    ...extra,
  };
}

/**
 * Builds the Plotly figure for a chart description.
 * @param spec - the engine's chart description, numbers already in display units
 * @param options - drawing choices the description leaves open
 * @returns data traces and layout for Plotly.react
 * @example
 * plotlyFromSpec(spec).data.length // one trace per point or curve layer
 */
export function plotlyFromSpec(spec: ChartSpec, options: FigureOptions = {}): PlotlyFigure {
  let curveIndex = 0;
  const data: Record<string, unknown>[] = [];
  const shapes: Record<string, unknown>[] = [];
  const annotations: Record<string, unknown>[] = [];
  const layout: Record<string, unknown> = {
    title: {
      text: spec.subtitle ? `${spec.title}<br><sub>${spec.subtitle}</sub>` : spec.title,
      x: 0,
      xanchor: 'left',
    },
    font: { family: 'Source Sans 3, Segoe UI, system-ui, sans-serif', color: chartPalette.axis },
    paper_bgcolor: '#ffffff',
    plot_bgcolor: '#ffffff',
    margin: { l: 70, r: 20, t: spec.subtitle ? 70 : 50, b: 50 },
    // To the right of the plot: below it, a long legend runs into the x-axis title.
    legend: { orientation: 'v', x: 1.02, xanchor: 'left', y: 1, yanchor: 'top' },
    hovermode: 'closest',
  };
  const domains = panelDomains(spec.panels);
  spec.panels.forEach((panel, i) => {
    const ids = axisIds(i);
    // Stacked panels over the same rates share the x axis: one title, at the bottom, and zoom together.
    const next = spec.panels[i + 1];
    const sharesX = next !== undefined && axisLabel(next.x) === axisLabel(panel.x);
    layout[ids.xKey] = axisLayout(panel.x, {
      anchor: ids.y,
      ...(sharesX ? { title: { text: '' } } : {}),
      ...(i > 0 && axisLabel(spec.panels[i - 1].x) === axisLabel(panel.x) ? { matches: 'x' } : {}),
    });
    layout[ids.yKey] = axisLayout(panel.y, { anchor: ids.x, domain: domains[i] });
    if (panel.title) {
      annotations.push({
        text: `<b>${panel.title}</b>`,
        xref: 'paper',
        yref: 'paper',
        x: 0,
        y: domains[i][1],
        xanchor: 'left',
        yanchor: 'bottom',
        showarrow: false,
      });
    }
    for (const layer of panel.layers) {
      switch (layer.kind) {
        case 'points': {
          const color = layer.excluded
            ? chartPalette.excluded
            : chartPalette.groups[layer.groupIndex % chartPalette.groups.length];
          const symbol =
            plotlySymbols[chartPalette.symbols[layer.groupIndex % chartPalette.symbols.length]];
          data.push({
            type: 'scatter',
            mode: 'markers',
            name: layer.name,
            legendgroup: layer.name,
            showlegend: i === 0,
            x: layer.x,
            y: layer.y,
            text: layer.labels,
            hovertemplate: layer.labels ? '%{text}<extra></extra>' : undefined,
            xaxis: ids.x,
            yaxis: ids.y,
            marker: layer.corrected
              ? {
                  color: chartPalette.corrected,
                  size: 16,
                  symbol: 'circle-open',
                  line: { width: 2 },
                }
              : {
                  color: color,
                  size: 8,
                  symbol: layer.excluded ? 'x-open' : symbol,
                  line: { width: 1, color: '#ffffff' },
                },
          });
          break;
        }
        case 'curve':
          data.push({
            type: 'scatter',
            mode: 'lines',
            name: layer.name,
            x: layer.x,
            y: layer.y,
            xaxis: ids.x,
            yaxis: ids.y,
            hoverinfo: 'skip',
            line:
              layer.role === 'chosen'
                ? { color: chartPalette.chosen, width: 3 }
                : layer.role === 'return'
                  ? { color: chartPalette.return, width: 2.5 }
                  : layer.role === 'risk'
                    ? { color: chartPalette.risk, width: 2.2 }
                    : {
                        color:
                          layer.groupIndex !== undefined
                            ? chartPalette.groups[layer.groupIndex % chartPalette.groups.length]
                            : options.colorCurves
                              ? chartPalette.groups[curveIndex++ % chartPalette.groups.length]
                              : chartPalette.alternative,
                        width: 1.5,
                        dash: layer.model ? modelDash(layer.model) : 'dot',
                      },
          });
          break;
        case 'ribbon':
          // Plotly fills between consecutive traces: the lower edge first, then the upper one
          // filled down to it ("tonexty"), both without lines.
          data.push(
            {
              type: 'scatter',
              mode: 'lines',
              x: layer.x,
              y: layer.low,
              xaxis: ids.x,
              yaxis: ids.y,
              line: { width: 0 },
              hoverinfo: 'skip',
              showlegend: false,
            },
            {
              type: 'scatter',
              mode: 'lines',
              name: layer.name,
              x: layer.x,
              y: layer.high,
              xaxis: ids.x,
              yaxis: ids.y,
              fill: 'tonexty',
              fillcolor: chartPalette[layer.role],
              line: { width: 0 },
              hoverinfo: 'skip',
            },
          );
          break;
        case 'band':
          shapes.push({
            type: 'rect',
            xref: ids.x,
            yref: `${ids.y} domain`,
            x0: layer.low,
            x1: layer.high,
            y0: 0,
            y1: 1,
            fillcolor: chartPalette[layer.role],
            line: { width: 0 },
            layer: 'below',
            name: layer.name,
            showlegend: i === 0,
          });
          break;
        case 'marker':
          shapes.push({
            type: 'line',
            xref: ids.x,
            yref: `${ids.y} domain`,
            x0: layer.x,
            x1: layer.x,
            y0: 0,
            y1: 1,
            line: { color: chartPalette[layer.role], width: 2, dash: 'dash' },
          });
          annotations.push({
            text: layer.label,
            xref: ids.x,
            yref: `${ids.y} domain`,
            x: layer.x,
            y: 1,
            xanchor: 'left',
            yanchor: 'top',
            showarrow: false,
            font: { color: chartPalette[layer.role] },
            bgcolor: 'rgba(255,255,255,0.85)',
          });
          break;
      }
    }
  });
  layout.shapes = shapes;
  layout.annotations = annotations;
  return { data, layout };
}
