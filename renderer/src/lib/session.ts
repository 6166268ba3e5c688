/**
 * The browser session: everything needed to come back to the same screen
 * after a reload — the trial files' bytes (base64), the user's edits, prices,
 * display settings, model choices and where the user was. Plain JSON.
 */
import type { Edits } from '../analysis/edits';
import type { PriceSettings } from '../analysis/priceInputs';
import type { BlockTerms, ModelName } from '../../../shared/models/modelTypes';
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
}

function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/**
 * Checks that parsed JSON is a session this build can restore.
 * @param data - parsed JSON
 * @returns the session, or null when any part has the wrong shape
 * @example
 * checkSession({}) // null
 */
export function checkSession(data: unknown): Session | null {
  if (!isObject(data) || data.version !== 1) return null;
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
  const prices = data.prices;
  if (
    !isObject(prices) ||
    !['grainPerKg', 'productPerKg', 'analysisPct', 'applicationPerHa'].every(
      (k) => typeof prices[k] === 'number',
    ) ||
    typeof prices.productId !== 'string' ||
    typeof prices.currency !== 'string'
  ) {
    return null;
  }
  if (data.unitSystem !== 'us' && data.unitSystem !== 'metric') return null;
  if (data.blocks !== 'none' && data.blocks !== 'fixed') return null;
  if (typeof data.locale !== 'string' || typeof data.step !== 'string') return null;
  if (!isObject(data.choices)) return null;
  if (data.selectedSite !== null && typeof data.selectedSite !== 'string') return null;
  const tolerance = data.shortfallTolerancePerHa;
  if (
    tolerance !== undefined &&
    tolerance !== null &&
    !(typeof tolerance === 'number' && tolerance >= 0)
  )
    return null;
  return data as unknown as Session;
}
