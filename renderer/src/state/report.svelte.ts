// The report: assembled on the main thread from the one analysis and its priced
// view (no refit, no bootstrap: assembleReport only reshapes), previewed as the
// grower page, exported as the workbook, printed or saved as PDF.
import { EMPTY_PAGE_FIELDS, type PageFields } from '../../../shared/report/pageFields';
import { growerPage, type GrowerPage } from '../../../shared/report/growerPage';
import { growerPageChart } from '../../../shared/report/growerPageChart';
import { renderChartSvg } from '../../../shared/report/svgChart';
import { reportRegionalChart } from '../../../shared/report/growerPageChart';
import { siteResponseChart } from '../../../shared/report/siteResponseChart';
import { levelChartKey, levelCurvesChart } from '../../../shared/report/levelCurvesChart';
import type { TrialReport } from '../../../shared/report/trialReport';
import type { SheetImage } from '../../../shared/report/workbookSite';
import type { ChartSpec } from '../../../shared/report/chartSpec';
import { assembleReport } from '../../../shared/report/assembleReport';
import { resultsJsonText } from '../../../shared/report/resultsJson';
import { mappingEntries } from '../../../shared/import/mappingEntries';
import { reportDisplay } from '../analysis/reportInput';
import { APP_VERSION } from '../lib/appVersion';
import { loadPlotly } from '../lib/loadPlotly';
import { plotlyFromSpec } from '../lib/plotlyFromSpec';
import type { FileBridge } from '../lib/fileBridge';
import type { Analysis } from './analysis.svelte';
import type { Jobs } from './jobs.svelte';
import type { Messages } from './messages.svelte';
import type { Prices } from './prices.svelte';
import type { Settings } from './settings.svelte';
import type { Trial } from './trial.svelte';

/** What the report reads of the workspace (the Workspace itself; named here so the two files do not import each other). */
export interface ReportHost {
  analysis: Analysis;
  prices: Prices;
  settings: Settings;
  trial: Trial;
  jobs: Jobs;
  bridge: FileBridge;
  messages: Messages;
}

/** The time now, ISO 8601 (a plain timestamp, not reactive state). */
function nowIso(): string {
  return new Date(Date.now()).toISOString();
}

async function chartPng(spec: ChartSpec): Promise<SheetImage> {
  // Loaded on first use, so this state class stays importable where there is no DOM (tests).
  const Plotly = await loadPlotly();
  const { data, layout } = plotlyFromSpec(spec);
  const url = await Plotly.toImage(
    { data, layout: { ...layout, width: spec.widthPx, height: spec.heightPx } },
    { format: 'png', width: spec.widthPx, height: spec.heightPx, scale: 2 },
  );
  const bytes = Uint8Array.from(atob(url.split(',')[1]), (c) => c.charCodeAt(0));
  return { png: bytes, widthPx: spec.widthPx, heightPx: spec.heightPx };
}

export class Report {
  /** The page shown: a site name or "region". */
  which = $state<string>('region');
  /** Who and what the pages are for, as typed in the report step; kept with the session and project. */
  fields = $state<PageFields>({ ...EMPTY_PAGE_FIELDS });
  busy = $state(false);
  readonly #ws: ReportHost;

  constructor(ws: ReportHost) {
    this.#ws = ws;
  }

  /**
   * The report of the current analysis at the current prices and picks, or null before there is
   * one (and while the analysis is a preview, so no page or file carries a regional model still
   * being fitted). Built from the analysis' priced view, so it always says what the screen says.
   */
  report: TrialReport | null = $derived.by(() => {
    const ws = this.#ws;
    const analysis = ws.analysis.output;
    const priced = ws.analysis.priced;
    if (!analysis || !priced || ws.analysis.regionalPending || ws.analysis.drawsPending)
      return null;
    const display = {
      ...reportDisplay(
        ws.prices.settings,
        ws.settings.units,
        ws.settings.unitSystem,
        analysis.crop,
        ws.settings.locale,
      ),
      pageFields: { ...this.fields },
    };
    const mapping = mappingEntries(
      Object.entries(ws.trial.edits.mappings).map(([file, m]) => ({ file, mapping: m })),
      undefined,
      {
        ...ws.trial.edits.settings,
        standardMoisturePct: analysis.table.standardMoisturePct,
      },
    );
    return assembleReport(analysis, priced, display, {
      tool: { name: 'Plotrate', version: APP_VERSION },
      createdAt: nowIso(),
      mapping,
      // The import's own findings; the analysis adds its quality checks, as on the command line.
      findings: ws.trial.built?.ok ? ws.trial.built.findings : [],
    });
  });

  /** The page shown: "region" when there is an across-site result, else the chosen or first site. */
  #shown: string | null = $derived.by(() => {
    const r = this.report;
    if (!r) return null;
    return (this.which === 'region' && !r.acrossSites ? r.sites[0]?.site : this.which) ?? null;
  });

  /** Grower page of the chosen site or region, or null before the report exists. */
  page: GrowerPage | null = $derived.by(() => {
    const r = this.report;
    if (!r || !this.#shown) return null;
    try {
      return growerPage(r, this.#shown);
    } catch {
      return null;
    }
  });

  /** The page's chart as SVG, the same description the PDF draws (growerPageChart); null without one. */
  pageChartSvg: string | null = $derived.by(() => {
    const r = this.report;
    if (!r || !this.#shown) return null;
    const spec = growerPageChart(r, this.#shown);
    return spec ? renderChartSvg(spec) : null;
  });

  /**
   * Writes the results JSON (the command line's --json file, the same bytes for the same analysis)
   * and hands it to the shell or a download.
   * @returns the name written, or null when there is no report or the user cancelled
   */
  async exportJson(): Promise<string | null> {
    const report = this.report;
    if (!report) return null;
    const stamp = report.createdAt.slice(0, 10);
    const bytes = new TextEncoder().encode(resultsJsonText(report));
    return this.#ws.bridge.exportFile(`Plotrate results ${stamp}.json`, bytes, 'json');
  }

  /** Draws the charts, writes the workbook in the worker and hands it to the shell or a download. */
  async exportWorkbook(): Promise<string | null> {
    const ws = this.#ws;
    const report = this.report;
    if (!report) return null;
    this.busy = true;
    try {
      const siteCharts: Record<string, SheetImage> = {};
      for (const site of report.sites)
        siteCharts[site.site] = await chartPng(siteResponseChart(report, site));
      const regional = reportRegionalChart(report);
      const acrossChart = regional ? await chartPng(regional) : null;
      // Each rate × factor site's levels chart, for its factor's sheet.
      const levelCharts: Record<string, SheetImage> = {};
      for (const l of report.levels)
        levelCharts[levelChartKey(l.site, l.factor)] = await chartPng(
          levelCurvesChart(report, l, null),
        );
      const bytes = await ws.jobs.run<Uint8Array>('Writing the workbook', 'workbook', {
        report,
        options: { siteCharts, acrossChart, levelCharts },
      });
      if (!bytes) return null;
      const stamp = report.createdAt.slice(0, 10);
      return await ws.bridge.exportFile(`Plotrate report ${stamp}.xlsx`, bytes, 'xlsx');
    } catch (error) {
      ws.messages.add(
        'error',
        'The workbook could not be written',
        error instanceof Error ? error.message : String(error),
      );
      return null;
    } finally {
      this.busy = false;
    }
  }
}
