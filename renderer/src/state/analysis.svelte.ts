// The one analysis (from the worker, price-free) and its priced view on the main thread.
import { untrack } from 'svelte';
import { analysisSettings } from '../../../shared/analysis/analysisSettings';
import { priceTrial, type PricedTrial } from '../../../shared/analysis/priceTrial';
import { illustrativePrices } from '../../../shared/economics/illustrativePrices';
import type { BlockTerms, ModelName } from '../../../shared/models/modelTypes';
import type { PlotTable } from '../../../shared/table/plotTable';
import {
  withDraws,
  withRegionalModels,
  type TrialRegionalModels,
} from '../../../shared/analysis/analyzeTrial';
import { regionalOf, siteLeads, siteOptima, type SiteOptimum } from '../analysis/pricing';
import {
  poolingTests,
  siteViews,
  type AnalysisOutput,
  type AnalysisPartial,
  type SiteAnalysis,
} from '../analysis/siteAnalysis';
import { JobFailedError } from '../lib/workerProtocol';
import type { Jobs } from './jobs.svelte';
import type { Messages } from './messages.svelte';
import type { Prices } from './prices.svelte';

export class Analysis {
  output = $state.raw<AnalysisOutput | null>(null);
  /** Site → the model the user chose to lead (else the pipeline's recommendation model). */
  choices = $state<Record<string, ModelName>>({});
  blocks = $state<BlockTerms>('fixed');
  selectedSite = $state<string | null>(null);
  /** True when the user stopped the fits before they finished. */
  stopped = $state(false);
  /**
   * True while `output` is the analysis' preview: every site's own result is in, the regional
   * mixed models and group comparisons are still being fitted (their entries say so). Nothing
   * is exported from a preview.
   */
  regionalPending = $state(false);
  /**
   * True while `output` is the preview and the sites are still being resampled: the optima are
   * in, their intervals and risks are not (the screens say so). Nothing is exported meanwhile.
   */
  drawsPending = $state(false);
  /** The table the current output was fitted to (identity), to skip refitting the same one. */
  #fittedTable: PlotTable | null = null;
  #fittedBlocks: BlockTerms | null = null;

  readonly #jobs: Jobs;
  readonly #messages: Messages;
  readonly #prices: Prices;

  constructor(jobs: Jobs, messages: Messages, prices: Prices) {
    this.#jobs = jobs;
    this.#messages = messages;
    this.#prices = prices;
  }

  /** The sites as the screen shows them (plots beside the pipeline's fits and tests). */
  sites: SiteAnalysis[] = $derived(this.output ? siteViews(this.output) : []);

  /** The common-response tests of the all-sites step. */
  pooling = $derived(this.output ? poolingTests(this.output.across) : []);

  /**
   * Site → leading model: the user's pick, else the analysis' recommendation model. It does
   * not depend on prices, so what depends on leads alone (the regional gains, the overlay of
   * curves) is not rebuilt while a price slider moves.
   */
  leads: Record<string, ModelName | null> = $derived(
    this.output ? siteLeads(this.output, this.choices) : {},
  );

  /**
   * The analysis at the current prices and the user's model picks (priceTrial): no refit, no
   * new bootstrap. Null before an analysis or while the prices cannot be used.
   */
  priced: PricedTrial | null = $derived.by(() => {
    const prices = this.#prices.canonical;
    const options = { shortfallTolerancePerHa: this.#prices.shortfallTolerancePerHa };
    return this.output && prices.ok
      ? priceTrial(this.output, prices.prices, this.choices, options)
      : null;
  });

  optima: SiteOptimum[] = $derived(this.priced ? siteOptima(this.sites, this.priced) : []);

  regional = $derived(this.priced ? regionalOf(this.priced) : null);

  /** The analysis of the selected site (the first one when none is selected). */
  site = $derived(this.sites.find((s) => s.site === this.selectedSite) ?? this.sites[0] ?? null);

  siteOptimum = $derived(this.optima.find((o) => o.site === this.site?.site) ?? null);

  /** The leading model of a site at the current prices. */
  leadOf(site: string): ModelName | null {
    return this.leads[site] ?? null;
  }

  /**
   * Analyzes the table in the worker (cancelling an analysis still running), with the analysis
   * defaults the command line uses. A table with no plots clears the results.
   */
  async run(table: PlotTable | null): Promise<void> {
    if (table === this.#fittedTable && this.blocks === this.#fittedBlocks) return;
    this.#fittedTable = table;
    this.#fittedBlocks = this.blocks;
    if (!table || table.plots.length === 0) {
      this.output = null;
      this.regionalPending = false;
      this.drawsPending = false;
      return;
    }
    this.stopped = false;
    try {
      // The analysis' own first pricing: the window re-prices it at whatever prices are in force.
      const priced = untrack(() => this.#prices.canonical);
      const settings = analysisSettings({
        prices: priced.ok ? { ...priced.prices } : illustrativePrices(table.crop).canonical,
        blocks: this.blocks === 'fixed' ? 'auto' : 'none',
      });
      // The sites are shown as soon as they are fitted (the preview), before their resamples and
      // the regional models: the regional models were most of the demo's across step (with the
      // worker started first, its first optimum came at a median of 1.06 against 1.21–1.29 s in
      // chromium), and the resamples most of each site's time.
      let preview: AnalysisOutput | null = null;
      const showEarly = (partial: AnalysisPartial) => {
        if (partial.kind === 'sites') {
          preview = partial.analysis;
          if (this.#fittedTable !== table) return;
          this.output = preview;
          this.regionalPending = true;
          this.drawsPending = preview.settings.resamples > 0;
        } else if (preview) {
          preview = withDraws(preview, partial.draws);
          if (this.#fittedTable !== table) return;
          this.output = preview;
          this.drawsPending = false;
        }
      };
      // The table is plain data (every state it is derived from is $state.raw), so it goes to the
      // worker as it is: a $state.snapshot would clone it once more before postMessage clones it
      // (78 ms of the demo's first analysis in a trace of the production build).
      const models = await this.#jobs.run<TrialRegionalModels, AnalysisPartial>(
        'Analyzing sites',
        'analyze',
        { table, settings },
        { onPartial: showEarly },
      );
      // The worker sends the sites once, in the preview, their draws once, and then what the
      // preview left pending.
      if (models && !preview) throw new Error('the analysis finished without sending its sites');
      const output = models && preview ? withRegionalModels(preview, models) : null;
      if (this.#fittedTable === table) {
        this.regionalPending = false;
        this.drawsPending = false;
      }
      if (output && this.#fittedTable === table) this.output = output;
      if (!output && this.#fittedTable === table) {
        // Stopped from the status bar: forget the table so "Fit again" (or any change) refits it.
        this.#fittedTable = null;
        this.output = null;
        this.stopped = true;
      }
    } catch (error) {
      if (this.#fittedTable === table && this.regionalPending) {
        // A preview whose regional models failed is not a result: show none rather than pending text.
        this.output = null;
        this.regionalPending = false;
        this.drawsPending = false;
      }
      const detail = error instanceof JobFailedError ? error.message : String(error);
      this.#messages.add('error', 'The fits could not be completed', detail);
    }
  }

  /** The optimum interval of a site's leading model, kg/ha, or null when there is none. */
  intervalFor(site: string): [number, number] | null {
    return this.optima.find((o) => o.site === site)?.intervalKgHa ?? null;
  }

  /** Picks the model that leads at a site (its optimum, chart and report). */
  choose(site: string, model: ModelName): void {
    this.choices = { ...this.choices, [site]: model };
  }
}
