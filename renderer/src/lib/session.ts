/**
 * The browser session: everything needed to come back to the same screen
 * after a reload — the trial files' bytes (base64), the user's edits, prices,
 * display settings, model choices and where the user was. Plain JSON.
 */
import { readPageFields, type PageFields } from '../../../shared/report/pageFields';
import type { Edits } from '../analysis/edits';
import type { PriceSettings } from '../analysis/priceInputs';
import { MODEL_NAMES, type BlockTerms, type ModelName } from '../../../shared/models/modelTypes';
import { MAX_JSON_DEPTH, nestedDeeperThan } from '../../../shared/project/fieldReader';
import { MAX_PRICE_PER_KG } from '../../../shared/project/projectFormat';
import type { UnitSystem } from './format';

export interface Session {
  version: 1;
  files: { name: string; base64: string }[];
  edits: Edits;
  prices: PriceSettings;
  unitSystem: UnitSystem;
  locale: string;
  choices: Record<string, ModelName>;
  blocks: BlockTerms;
  step: string;
  selectedSite: string | null;
  /** The risk tables' tolerance, currency/ha; null or absent (older sessions): the default. */
  shortfallTolerancePerHa?: number | null;
  /** Grower, advisor, field and season of the grower pages; absent in older sessions. */
  pageFields?: PageFields;
}

function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** A number in [low, high]: never NaN or infinite. */
function within(v: unknown, low: number, high: number): boolean {
  return typeof v === 'number' && v >= low && v <= high;
}

/**
 * The saved prices hold the bounds a project file's prices do (shared/project): grain and
 * product per kg from 0 to MAX_PRICE_PER_KG, the nutrient share of the product a percentage
 * above 0, the application cost per hectare no more than a price per kg could make it.
 */
function plausiblePrices(prices: Record<string, unknown>): boolean {
  return (
    within(prices.grainPerKg, 0, MAX_PRICE_PER_KG) &&
    within(prices.productPerKg, 0, MAX_PRICE_PER_KG) &&
    within(prices.analysisPct, Number.MIN_VALUE, 100) &&
    within(prices.applicationPerHa, 0, MAX_PRICE_PER_KG) &&
    typeof prices.productId === 'string' &&
    typeof prices.currency === 'string'
  );
}

/**
 * Checks that parsed JSON is a session this build can restore.
 * @param data - parsed JSON
 * @returns the session, or null when any part has the wrong shape
 * @example
 * checkSession({}) // null
 */
/** Corrections hold, per plot and role, a value of 0 or more (kg/ha) and a reason. */
function plausibleCorrections(corrections: unknown): boolean {
  if (!isObject(corrections)) return false;
  return Object.values(corrections).every(
    (byRole) =>
      isObject(byRole) &&
      Object.entries(byRole).every(
        ([role, c]) =>
          (role === 'rate' || role === 'yield') &&
          isObject(c) &&
          within(c.toKgHa, 0, 1e6) &&
          typeof c.reason === 'string',
      ),
  );
}

export function checkSession(data: unknown): Session | null {
  if (!isObject(data) || data.version !== 1) return null;
  // As for a project file: a record nested deeper than Plotrate ever writes is damaged.
  if (nestedDeeperThan(data, MAX_JSON_DEPTH)) return null;
  const files = data.files;
  if (
    !Array.isArray(files) ||
    !files.every((f) => isObject(f) && typeof f.name === 'string' && typeof f.base64 === 'string')
  ) {
    return null;
  }
  const edits = data.edits;
  if (
    !isObject(edits) ||
    !isObject(edits.mappings) ||
    !isObject(edits.settings) ||
    !isObject(edits.decisions) ||
    typeof edits.settings.crop !== 'string'
  ) {
    return null;
  }
  if (edits.corrections !== undefined && !plausibleCorrections(edits.corrections)) return null;
  if (!isObject(data.prices) || !plausiblePrices(data.prices)) return null;
  if (data.unitSystem !== 'us' && data.unitSystem !== 'metric') return null;
  if (data.blocks !== 'none' && data.blocks !== 'fixed') return null;
  if (typeof data.locale !== 'string' || typeof data.step !== 'string') return null;
  if (
    !isObject(data.choices) ||
    !Object.values(data.choices).every((m) => MODEL_NAMES.includes(m as ModelName))
  )
    return null;
  if (data.selectedSite !== null && typeof data.selectedSite !== 'string') return null;
  const tolerance = data.shortfallTolerancePerHa;
  if (
    tolerance !== undefined &&
    tolerance !== null &&
    !(typeof tolerance === 'number' && tolerance >= 0)
  )
    return null;
  // Page fields are read field by field (readPageFields): a bad one is blanked, not fatal.
  const pageFields =
    data.pageFields === undefined ? {} : { pageFields: readPageFields(data.pageFields) };
  return { ...(data as unknown as Session), ...pageFields };
}
