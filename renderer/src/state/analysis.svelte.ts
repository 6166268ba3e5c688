// Fits (from the worker, price-free) and everything re-priced from them on the main thread.
import { untrack } from 'svelte';
import type { BlockTerms, ModelName } from '../../../shared/models/modelTypes';
import { ILLUSTRATIVE_PRICES, canonicalPrices } from '../analysis/priceInputs';
import { chooseSiteModels } from '../../../shared/analysis/chooseSiteModels';
import type { PlotTable } from '../../../shared/table/plotTable';
import { regionalAtPrices, siteLeads, siteOptima, type SiteOptimum } from '../analysis/pricing';
import {
  poolingTests,
  siteViews,
  type AnalysisOutput,
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
  /** Site → interval of the leading model's optimum, kg/ha (bootstrap, at the current prices). */
  intervals = $state.raw<Record<string, [number, number]>>({});
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
  pooling = $derived(this.output ? poolingTests(this.output.analysis) : []);

  /**
   * Site → leading model: the user's pick, else the pipeline's recommendation model. It does
   * not depend on prices, so what depends on leads alone (the regional gains, the overlay of
   * curves) is not rebuilt while a price slider moves.
   */
  leads: Record<string, ModelName | null> = $derived(
    this.output ? siteLeads(this.output.analysis, this.choices) : {},
  );

  /** The pipeline's analysis with the user's models: rebuilt only when fits or choices change. */
  #chosen = $derived(this.output ? chooseSiteModels(this.output.analysis, this.choices) : null);

  optima: SiteOptimum[] = $derived.by(() => {
    const priced = this.#prices.canonical;
    if (!priced.ok) return [];
    return siteOptima(this.sites, this.leads, priced.prices);
  });

  regional = $derived.by(() => {
    const priced = this.#prices.canonical;
    return priced.ok && this.#chosen ? regionalAtPrices(this.#chosen, priced.prices) : null;
  });

  /** The analysis of the selected site (the first one when none is selected). */
  site = $derived(this.sites.find((s) => s.site === this.selectedSite) ?? this.sites[0] ?? null);

  siteOptimum = $derived(this.optima.find((o) => o.site === this.site?.site) ?? null);

  /** The leading model of a site at the current prices. */
  leadOf(site: string): ModelName | null {
    return this.leads[site] ?? null;
  }

  /**
   * Fits the table in the worker (cancelling a fit still running). A table
   * with no plots clears the results.
   */
  async run(table: PlotTable | null): Promise<void> {
    if (table === this.#fittedTable && this.blocks === this.#fittedBlocks) return;
    this.#fittedTable = table;
    this.#fittedBlocks = this.blocks;
    if (!table || table.plots.length === 0) {
      this.output = null;
      return;
    }
    this.intervals = {};
    this.stopped = false;
    try {
      // Any valid prices do for the first pricing: the window re-prices without refitting.
      const priced = untrack(() => this.#prices.canonical);
      const output = await this.#jobs.run<AnalysisOutput>('Fitting sites', 'analyze', {
        table: $state.snapshot(table),
        blocks: this.blocks,
        prices: priced.ok ? { ...priced.prices } : canonicalPrices(ILLUSTRATIVE_PRICES),
      });
      if (output && this.#fittedTable === table) this.output = output;
      if (!output && this.#fittedTable === table) {
        // Stopped from the status bar: forget the table so "Fit again" (or any change) refits it.
        this.#fittedTable = null;
        this.output = null;
        this.stopped = true;
      }
    } catch (error) {
      const detail = error instanceof JobFailedError ? error.message : String(error);
      this.#messages.add('error', 'The fits could not be completed', detail);
    }
  }

  /**
   * Bootstraps every site's optimum interval in the worker at the current
   * prices and leading models (cancelling a run still going).
   */
  async refreshIntervals(): Promise<void> {
    const output = this.output;
    const priced = this.#prices.canonical;
    if (!output || !priced.ok) return;
    const leads = untrack(() => this.leads);
    const sites = untrack(() => this.sites).flatMap((s, index) => {
      const model = leads[s.site];
      const blocks = output.analysis.sites[index].blocks;
      return model
        ? [
            {
              site: s.site,
              index,
              model,
              blocks,
              rateKgHa: s.plots.rateKgHa,
              yieldKgHa: s.plots.yieldKgHa,
              block: s.plots.block,
            },
          ]
        : [];
    });
    try {
      const found = await this.#jobs.run<Record<string, [number, number]>>(
        'Optimum intervals',
        'intervals',
        { sites, prices: { ...priced.prices } },
      );
      if (found && this.output === output) this.intervals = found;
    } catch (error) {
      this.#messages.add('warning', 'The optimum intervals could not be computed', String(error));
    }
  }

  /** The optimum interval of a site's leading model, kg/ha, or null when not computed. */
  intervalFor(site: string): [number, number] | null {
    return this.intervals[site] ?? null;
  }

  /** Picks the model that leads at a site (its optimum, chart and report). */
  choose(site: string, model: ModelName): void {
    this.choices = { ...this.choices, [site]: model };
  }
}
