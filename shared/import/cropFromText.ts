/**
 * The crop a sheet's name or title names, so a workbook with a corn sheet and a
 * wheat sheet does not pour both into one table by accident.
 */
import type { CropId } from '../table/plotTable';

const words: [CropId, RegExp][] = [
  ['corn', /\b(corn|maize)\b/],
  ['wheat', /\bwheat\b/],
  ['soybean', /\bsoy(beans?|a)?\b/],
  ['barley', /\bbarley\b/],
  ['sorghum', /\b(sorghum|milo)\b/],
  ['oats', /\boats?\b/],
  ['canola', /\b(canola|rapeseed|oilseed rape)\b/],
];

/**
 * Finds the one crop a text names.
 * @param text - a sheet name, title rows, …
 * @returns the crop, or null when it names none or more than one
 * @example
 * cropFromText('2025 winter wheat N trial') // 'wheat'
 */
export function cropFromText(text: string): CropId | null {
  const t = text.toLowerCase();
  const found = words.filter(([, re]) => re.test(t)).map(([c]) => c);
  return found.length === 1 ? found[0] : null;
}
