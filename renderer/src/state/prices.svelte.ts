// The prices every optimum and chart reads; stored canonical (per kg, per ha).
import type { Prices as CanonicalPrices } from '../../../shared/economics/priceRatio';
import type { CropId } from '../../../shared/table/plotTable';
import {
  checkPriceRatio,
  priceRatioFarOff,
  type PriceRatioCheck,
} from '../../../shared/economics/priceRatioCheck';
import { History } from './history.svelte';
import {
  canonicalPrices,
  illustrativePriceSettings,
  ILLUSTRATIVE_PRICES,
  type PriceSettings,
} from '../analysis/priceInputs';

/** The Undo button's words for a change of each price input. */
const PRICE_STEP_LABELS: Partial<Record<keyof PriceSettings, string>> = {
  grainPerKg: 'Grain price',
  productPerKg: 'Product price',
  productId: 'Product',
  analysisPct: 'Analysis',
  applicationPerHa: 'Application cost',
  currency: 'Currency',
};

export class Prices {
  #given = $state<PriceSettings>({ ...ILLUSTRATIVE_PRICES });
  /**
   * How far below the best a rate may return before the risk tables count it as falling short,
   * currency per ha; null: the default, the cost of 10 kg N/ha at the prices in force. Not a
   * price, so setting it leaves illustrative prices illustrative.
   */
  shortfallTolerancePerHa = $state<number | null>(null);
  /** A price ratio the user confirmed though it is far from the crop's usual (checkPriceRatio). */
  confirmedRatio = $state<number | null>(null);
  #crop: () => CropId = () => 'corn';
  readonly #history: History;

  /**
   * @param crop - the current crop: illustrative grain prices follow it until the user gives one
   * @param history - the workspace's undo history, which price changes go to
   */
  constructor(crop: () => CropId = () => 'corn', history: History = new History()) {
    this.#crop = crop;
    this.#history = history;
  }

  /** The price inputs in force: the user's, or the crop's illustrative ones (shared with the command line). */
  #settings = $derived(
    this.#given.illustrative
      ? { ...illustrativePriceSettings(this.#crop()), currency: this.#given.currency }
      : this.#given,
  );

  get settings(): PriceSettings {
    return this.#settings;
  }

  set settings(value: PriceSettings) {
    this.#given = value;
  }

  /** The canonical prices, or the reason they cannot be used (shown by the price fields). */
  canonical:
    | { ok: true; prices: CanonicalPrices }
    | { ok: false; reason: string; ratioCheck?: PriceRatioCheck } = $derived.by(() => {
    try {
      const prices = canonicalPrices(this.settings);
      if (!(prices.grainPricePerKg > 0))
        return { ok: false, reason: 'Enter a grain price above 0.' };
      if (!(prices.nutrientPricePerKg > 0)) {
        return { ok: false, reason: 'Enter a product price above 0.' };
      }
      if (!(prices.applicationCostPerHa! >= 0)) {
        return { ok: false, reason: 'The application cost cannot be negative.' };
      }
      const check = checkPriceRatio(prices, this.#crop());
      if (!check.plausible && this.confirmedRatio !== check.ratio) {
        return {
          ok: false,
          reason: `${priceRatioFarOff(check, this.#crop())}. Check the prices (a decimal mark, or a price per tonne typed as per kilogram?); no rate is shown until they are right or you confirm them.`,
          ratioCheck: check,
        };
      }
      return { ok: true, prices };
    } catch (error) {
      return { ok: false, reason: error instanceof Error ? error.message : String(error) };
    }
  });

  /**
   * Changes some inputs (undoable; a price typed digit by digit or dragged is one step); any edit
   * makes the prices the user's own.
   */
  update(change: Partial<PriceSettings>): void {
    const before = this.#given;
    const after: PriceSettings = { ...this.#settings, ...change, illustrative: false };
    this.#given = after;
    const what = Object.keys(change)[0] as keyof PriceSettings;
    this.#history.record(
      PRICE_STEP_LABELS[what] ?? 'Prices',
      { before: () => (this.#given = before), after: () => (this.#given = after) },
      true,
    );
  }

  /** Sets the shortfall tolerance, or null for the default (undoable, as a price is). */
  setTolerance(perHa: number | null): void {
    const before = this.shortfallTolerancePerHa;
    this.shortfallTolerancePerHa = perHa;
    this.#history.record(
      'Shortfall tolerance',
      {
        before: () => (this.shortfallTolerancePerHa = before),
        after: () => (this.shortfallTolerancePerHa = perHa),
      },
      perHa !== null,
    );
  }
}
