// Fits (from the worker, price-free) and everything re-priced from them on the main thread.
import { untrack } from 'svelte';
import type { BlockTerms, ModelName } from '../../../shared/models/modelTypes';
import type { PlotTable } from '../../../shared/table/plotTable';
import {
  prepareRegional,
  regionalAtPrices,
  siteOptima,
  type SiteOptimum,
} from '../analysis/pricing';
import type { AnalysisOutput } from '../analysis/siteAnalysis';
import { JobFailedError } from '../lib/workerProtocol';
import type { Jobs } from './jobs.svelte';
import type { Messages } from './messages.svelte';
import type { Prices } from './prices.svelte';

export class Analysis {
  output = $state.raw<AnalysisOutput | null>(null);
  /** Site → the model the user chose to lead (else the best by AICc). */
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

  optima: SiteOptimum[] = $derived.by(() => {
    const priced = this.#prices.canonical;
    if (!this.output || !priced.ok) return [];
    return siteOptima(this.output.sites, this.choices, priced.prices);
  });

  /** Site → leading model; a string key, so the regional gains below are only re-prepared when a lead changes. */
  #leadKey = $derived(this.optima.map((o) => `${o.site}\u0000${o.model ?? ''}`).join('\u0001'));

  /**
   * Site → leading model. Changes only when a lead changes (not on every price
   * tick), so what depends on leads alone — the regional gains, the overlay of
   * curves — is not rebuilt while a price slider moves.
   */
  leads: Record<string, ModelName | null> = $derived.by(() => {
    void this.#leadKey;
    return untrack(() => Object.fromEntries(this.optima.map((o) => [o.site, o.model] as const)));
  });

  /** Price-free regional gains: recomputed only when fits or leading models change. */
  #prepared = $derived(this.output ? prepareRegional(this.output.sites, this.leads) : null);

  regional = $derived.by(() => {
    const priced = this.#prices.canonical;
    return priced.ok ? regionalAtPrices(this.#prepared, priced.prices) : null;
  });

  /** The analysis of the selected site (the first one when none is selected). */
  site = $derived(
    this.output?.sites.find((s) => s.site === this.selectedSite) ?? this.output?.sites[0] ?? null,
  );

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
      const output = await this.#jobs.run<AnalysisOutput>('Fitting sites', 'analyse', {
        table: $state.snapshot(table),
        blocks: this.blocks,
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
    const leads = untrack(() => this.optima);
    const sites = output.sites.flatMap((s, index) => {
      const model = leads.find((o) => o.site === s.site)?.model;
      return model
        ? [
            {
              site: s.site,
              index,
              model,
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
        { sites, blocks: this.blocks, prices: { ...priced.prices } },
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
