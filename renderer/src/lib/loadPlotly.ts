/**
 * Plotly, loaded once on first use. Plotly is most of the workspace's code (about 3.5 MB
 * minified) and takes over a second to evaluate on a slow machine; loaded with the page, it held
 * back everything after it, the analysis worker's start included. Loaded here instead, the page
 * draws its steps and starts the analysis while Plotly arrives, and every chart and export waits
 * on the same promise.
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
