/**
 * Nitrogen fertilizer products and their N content, so a rate given as product
 * can become a nutrient rate (nutrient = product × analysis / 100).
 *
 * The analyses are the grades the trade sells these products at (common
 * practice; the guaranteed analysis on a label can differ slightly): urea
 * 46-0-0, UAN solution 28 % and 32 %, anhydrous ammonia 82-0-0, ammonium
 * sulfate 21-0-0 (24 % S), ammonium nitrate 34-0-0. Rates of a liquid are taken
 * by weight (lb or kg of solution), not by volume.
 */

export type ProductId =
  'nitrogen' | 'urea' | 'uan28' | 'uan32' | 'anhydrous' | 'ammoniumSulfate' | 'ammoniumNitrate';

export interface FertilizerProduct {
  id: ProductId;
  label: string;
  /** N content, % by weight. */
  nitrogenPct: number;
  /** Words that name the product in a sheet (lower case), for detection. */
  words: readonly string[];
}

const list: readonly FertilizerProduct[] = [
  { id: 'nitrogen', label: 'Nitrogen (as N)', nitrogenPct: 100, words: ['n', 'nitrogen'] },
  { id: 'urea', label: 'Urea 46-0-0', nitrogenPct: 46, words: ['urea', '46-0-0'] },
  { id: 'uan28', label: 'UAN 28 %', nitrogenPct: 28, words: ['uan28', 'uan 28', '28%', '28-0-0'] },
  { id: 'uan32', label: 'UAN 32 %', nitrogenPct: 32, words: ['uan32', 'uan 32', '32%', '32-0-0'] },
  {
    id: 'anhydrous',
    label: 'Anhydrous ammonia 82-0-0',
    nitrogenPct: 82,
    words: ['anhydrous', 'nh3', '82-0-0'],
  },
  {
    id: 'ammoniumSulfate',
    label: 'Ammonium sulfate 21-0-0',
    nitrogenPct: 21,
    words: ['ammonium sulfate', 'ammonium sulphate', 'ams', '21-0-0'],
  },
  {
    id: 'ammoniumNitrate',
    label: 'Ammonium nitrate 34-0-0',
    nitrogenPct: 34,
    words: ['ammonium nitrate', 'an', '34-0-0'],
  },
];

/** Every product, in menu order. */
export const productIds: readonly ProductId[] = list.map((p) => p.id);

/**
 * Looks up a product.
 * @param id - a product identifier
 * @returns the product with its N content (%)
 * @throws {RangeError} for an unknown id (unchecked data from a project file)
 * @example
 * products('urea').nitrogenPct // 46
 */
export function products(id: ProductId): FertilizerProduct {
  const found = list.find((p) => p.id === id);
  if (!found) {
    throw new RangeError(
      `Unknown product "${String(id)}"; known products are ${productIds.join(', ')}.`,
    );
  }
  return found;
}

/**
 * Finds the product a piece of sheet text names, if any ("Urea", "UAN 28%", "NH3").
 * @param text - a cell's text
 * @returns the product, or null when the text names none
 * @example
 * productFromText('UAN-32')?.id // 'uan32'
 */
export function productFromText(text: string): FertilizerProduct | null {
  const t = text.toLowerCase().replace(/[-_]/g, ' ').replace(/\s+/g, ' ').trim();
  const compact = t.replace(/\s/g, '');
  for (const p of list) {
    if (p.id === 'nitrogen') continue;
    for (const w of p.words) {
      const wn = w.replace(/-/g, ' ');
      // Short words ("an", "ams") only count as a whole word, not inside "plant".
      if (
        w.length <= 3
          ? new RegExp(`(^|[^a-z])${w}([^a-z]|$)`).test(t)
          : t.includes(wn) || compact.includes(wn.replace(/\s/g, ''))
      ) {
        return p;
      }
    }
  }
  return null;
}
