// The few Plotly calls the renderer makes; the dist bundle ships no types.
declare module 'plotly.js-dist-min' {
  export type PlotlyData = Record<string, unknown>;
  export type PlotlyLayout = Record<string, unknown>;
  export type PlotlyConfig = Record<string, unknown>;
  export interface PlotlyHTMLElement extends HTMLElement {
    on(event: string, handler: (event: unknown) => void): void;
    removeAllListeners?(event: string): void;
  }
  export function react(
    root: HTMLElement,
    data: PlotlyData[],
    layout?: PlotlyLayout,
    config?: PlotlyConfig,
  ): Promise<PlotlyHTMLElement>;
  export function purge(root: HTMLElement): void;
  export function toImage(
    root: HTMLElement | { data: PlotlyData[]; layout?: PlotlyLayout },
    options: { format: 'png' | 'svg' | 'jpeg'; width: number; height: number; scale?: number },
  ): Promise<string>;
  const Plotly: {
    react: typeof react;
    purge: typeof purge;
    toImage: typeof toImage;
  };
  export default Plotly;
}
