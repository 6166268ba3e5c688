// A one-panel chart of 600 × 400 px, N rate 0–200 kg N/ha against yield 0–10 t/ha, for the chart
// writers' tests (SVG, PNG, PDF): only its title, subtitle and layers vary.
import type { ChartLayer, ChartSpec } from '../shared/report/chartSpec';

/**
 * The test chart.
 * @param title - the chart's title ("" for none)
 * @param layers - what the panel shows
 * @param subtitle - the line under the title ("" for none)
 * @returns the chart description
 */
export function onePanelChart(title: string, layers: ChartLayer[], subtitle = ''): ChartSpec {
  return {
    title,
    subtitle,
    note: '',
    widthPx: 600,
    heightPx: 400,
    panels: [
      {
        id: 'response',
        title: '',
        x: { title: 'N rate', unit: 'kg N/ha', min: 0, max: 200 },
        y: { title: 'Yield', unit: 't/ha', min: 0, max: 10 },
        heightShare: 1,
        layers,
      },
    ],
  };
}
