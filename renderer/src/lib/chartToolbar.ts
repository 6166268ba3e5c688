/**
 * The chart toolbar's buttons and Plotly's sharing switches, in one place.
 *
 * Trial data is confidential and Plotrate is a desktop tool, so the toolbar is an allowlist of
 * actions that stay on this computer: zooming, panning, resetting the axes and saving a picture.
 * Plotly 4 adds a button that uploads the chart to its online service unless told not to
 * (`showSendToCloud` defaults to true); naming the buttons outright keeps any button a later
 * Plotly adds off the toolbar too, and the sharing switches are off besides.
 */

/** Toolbar buttons that act on the chart in this window only, in the order shown. */
export const LOCAL_CHART_BUTTONS = [
  ['toImage'],
  ['zoom2d', 'pan2d', 'zoomIn2d', 'zoomOut2d', 'autoScale2d', 'resetScale2d'],
] as const;

/** The Plotly config every chart gets (PlotlyChart.svelte). */
export const CHART_CONFIG = {
  responsive: true,
  displaylogo: false,
  modeBarButtons: LOCAL_CHART_BUTTONS.map((group) => [...group]),
  showSendToCloud: false,
  showEditInChartStudio: false,
  showLink: false,
  // No server to send to: an empty URL instead of Plotly's online address.
  plotlyServerURL: '',
  // The picture is saved by the shell's own download handling, under a plain name.
  toImageButtonOptions: { format: 'png', filename: 'plotrate-chart', scale: 2 },
} as const;
