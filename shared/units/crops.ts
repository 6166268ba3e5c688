/**
 * What the unit tables know about each crop.
 *
 * Bushel weights are the USDA standard test weights used to turn bushels into
 * pounds (USDA ERS, "Weights, Measures, and Conversion Factors for Agricultural
 * Commodities and Their Products", Agricultural Handbook 697, 1992; values
 * written from memory of that table). Standard moistures are the market bases
 * common in the trade (common practice; they vary by buyer and country, which is
 * why a user setting can override them). The upper yield bound is not a
 * document: it is a ceiling about 1.5× the highest yields reported in
 * contests, chosen here to flag typing errors, not agronomy.
 */
import type { CropId } from '../table/plotTable';

export interface CropInfo {
  id: CropId;
  /** Name to show the user. */
  label: string;
  /** Standard test weight of one bushel, lb/bu (USDA). */
  bushelLb: number;
  /** Market standard moisture, % wet basis (common practice). */
  standardMoisturePct: number;
  /** A yield above this, kg/ha at standard moisture, is taken as implausible. */
  maxPlausibleYieldKgHa: number;
}

const table: Record<CropId, CropInfo> = {
  corn: {
    id: 'corn',
    label: 'Corn (maize)',
    bushelLb: 56,
    standardMoisturePct: 15.5,
    maxPlausibleYieldKgHa: 25000,
  },
  wheat: {
    id: 'wheat',
    label: 'Wheat',
    bushelLb: 60,
    standardMoisturePct: 13.5,
    maxPlausibleYieldKgHa: 16000,
  },
  soybean: {
    id: 'soybean',
    label: 'Soybean',
    bushelLb: 60,
    standardMoisturePct: 13,
    maxPlausibleYieldKgHa: 9000,
  },
  barley: {
    id: 'barley',
    label: 'Barley',
    bushelLb: 48,
    standardMoisturePct: 14.5,
    maxPlausibleYieldKgHa: 14000,
  },
  sorghum: {
    id: 'sorghum',
    label: 'Grain sorghum',
    bushelLb: 56,
    standardMoisturePct: 14,
    maxPlausibleYieldKgHa: 16000,
  },
  oats: {
    id: 'oats',
    label: 'Oats',
    bushelLb: 32,
    standardMoisturePct: 14,
    maxPlausibleYieldKgHa: 12000,
  },
  canola: {
    id: 'canola',
    label: 'Canola (rapeseed)',
    bushelLb: 50,
    standardMoisturePct: 10,
    maxPlausibleYieldKgHa: 8000,
  },
};

/**
 * The band of yields, kg/ha at standard moisture, within which a column's values can be read as
 * this crop's yields: up to the crop's plausible ceiling and down to a fiftieth of it. The floor
 * is this project's rule, not a document: a trial plot yielding less than that is a failed crop,
 * so a reading of a column that puts its median below it is a reading in the wrong unit.
 * @example plausibleYieldBandKgHa('corn') // [500, 25000]
 */
export function plausibleYieldBandKgHa(id: CropId): [number, number] {
  const ceiling = crops(id).maxPlausibleYieldKgHa;
  return [ceiling / 50, ceiling];
}

/** Every crop the tables know, in a stable order for menus. */
export const cropIds: readonly CropId[] = Object.keys(table) as CropId[];

/**
 * Looks up a crop's bushel weight, standard moisture and yield bound.
 * @param id - a crop identifier
 * @returns the crop's entry
 * @throws {RangeError} when the id is not one of {@link cropIds} (a programming error:
 *   CropId is a closed type, so this only happens with unchecked data from a project file)
 * @example
 * crops('corn').bushelLb // 56
 */
export function crops(id: CropId): CropInfo {
  const info = table[id];
  if (!info) {
    throw new RangeError(`Unknown crop "${String(id)}"; known crops are ${cropIds.join(', ')}.`);
  }
  return info;
}

/**
 * Whether a string names a known crop.
 * @param value - any text, e.g. from a project file
 * @returns true when it is a CropId
 * @example
 * isCropId('corn') // true
 */
export function isCropId(value: string): value is CropId {
  return Object.prototype.hasOwnProperty.call(table, value);
}
