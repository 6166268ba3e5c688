/**
 * Plotly, loaded once on first use. Plotly is most of the workspace's code (about 3.5 MB
 * minified) and takes over a second to evaluate on a slow machine, during which the page can do
 * nothing else; loaded with the page, it held back everything after it, the analysis worker's
 * start included. Loaded when the first chart is drawn instead, the page shows its steps and the
 * first optimum before Plotly arrives (preloading it at start was measured too: the optimum came
 * 1.5–2 s later, the chart no sooner), and every chart and export waits on the same promise.
 */
type Plotly = (typeof import('plotly.js-dist-min'))['default'];

let loading: Promise<Plotly> | null = null;

/**
 * The Plotly module, loading it on the first call.
 * @returns a promise of Plotly, the same one for every caller
 * @example
 * const Plotly = await loadPlotly();
 */
export function loadPlotly(): Promise<Plotly> {
  loading ??= import('plotly.js-dist-min').then((m) => m.default);
  return loading;
}
