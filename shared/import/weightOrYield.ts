/**
 * Yield per area, or grain weight per plot? The one rule import uses to tell them apart, from all
 * the evidence rather than the first word that matches:
 * - a unit in the header decides: a mass per area (bu/ac, t/ha, kg/ha, lb/ac, g/m²) is a yield;
 *   a mass alone or per plot ("(kg)", "lb/plot") is a plot weight, since a yield needs an area;
 * - without one, the header's words (weight, wt, mass, harvested, per plot against yield, yld)
 *   and the sheet's plot size (an area column, or length and width) are weighed against the
 *   values: each reading's median yield in kg/ha is compared with the crop's plausible band
 *   (shared/units/crops `plausibleYieldBandKgHa`).
 * Where the words and the values leave both readings open, the column gets a question instead of
 * a guess: "6,350 kg/ha if plot weights in kg over 12 m²; 9,760 kg/ha if yields in t/ha". A yield
 * is never computed from a guess between the two.
 */
import type { CropId } from '../table/plotTable';
import { cropIds, plausibleYieldBandKgHa } from '../units/crops';
import {
  convertYield,
  plotWeightToKgHa,
  type MassUnit,
  type YieldUnit,
} from '../units/convertYield';
import {
  UNITS_BY_ROLE,
  type ColumnQuestion,
  type ColumnReading,
  type HeaderUnit,
} from './columnMapping';
import { normalizeHeader, unitFromHeader } from './headerWords';
import { sampleMedian } from '../stats/quantile';

/** What the decision needs to know about a column and its sheet. */
export interface WeightOrYieldInput {
  header: string;
  /** The column's numbers (the rows detection reads). */
  values: readonly number[];
  /** Median plot area of the sheet's area or length × width columns, m²; null without them. */
  plotAreaM2: number | null;
  /** Other headers of the sheet name US units (bu, lb, ac). */
  usHints: boolean;
  /** The crop the sheet names, or null: then any crop's band is allowed. */
  crop: CropId | null;
}

export interface WeightOrYieldDecision {
  role: 'yield' | 'plotWeight';
  unit: HeaderUnit;
  /** Why, in words for the user (joined into the column's evidence). */
  evidence: string[];
  /** Set when the evidence leaves both readings open: the column is not read until answered. */
  question: ColumnQuestion | null;
}

/** Words for a weighed plot; "grain wt" and "plot yield" are plot weights, "grain" alone is not. */
const WEIGHT_WORDS = /\b(w(eigh)?t|mass|harvested|per plot|plot yield|plot grain)\b/;

/**
 * The yield unit values are in when the header names none: the ranges of t/ha (under 25),
 * bu/ac (25 to 400) and kg/ha or lb/ac (above) hardly overlap for any crop; between the last two
 * the other headers' units decide.
 */
export function yieldUnitFromValues(m: number, usHints: boolean): YieldUnit {
  if (m < 25) return 't/ha';
  if (m < 400) return 'bu/ac';
  return usHints ? 'lb/ac' : 'kg/ha';
}

function band(crop: CropId | null): [number, number] {
  if (crop) return plausibleYieldBandKgHa(crop);
  const all = cropIds.map(plausibleYieldBandKgHa);
  return [Math.min(...all.map((b) => b[0])), Math.max(...all.map((b) => b[1]))];
}

const kgHa = (v: number) => `${Math.round(v).toLocaleString('en-US')} kg/ha`;

/**
 * Decides whether a column holds yields or plot weights, and in which unit.
 * @param input - the header, the values, the sheet's plot area and unit hints, the crop
 * @returns the role and unit with the evidence, and a question when the evidence is not enough
 * @example
 * weightOrYield({ header: 'Harvested grain (kg/plot)', values: [8.9], plotAreaM2: 12, usHints: false, crop: 'wheat' })
 * // { role: 'plotWeight', unit: 'kg', question: null, … }
 */
export function weightOrYield(input: WeightOrYieldInput): WeightOrYieldDecision {
  const { header, values, plotAreaM2, usHints } = input;
  const named = unitFromHeader(header);
  if (named && UNITS_BY_ROLE.yield!.includes(named.unit)) {
    return {
      role: 'yield',
      unit: named.unit,
      evidence: [`unit "${named.text}" is a yield per area`],
      question: null,
    };
  }
  if (named && UNITS_BY_ROLE.plotWeight!.includes(named.unit)) {
    return {
      role: 'plotWeight',
      unit: named.unit,
      evidence: [`unit "${named.text}" is a weight with no area, so a plot's harvested weight`],
      question: null,
    };
  }
  const h = normalizeHeader(header).replace(/[([{].*?[)\]}]/g, ' ');
  const weightWord = WEIGHT_WORDS.exec(h)?.[0] ?? null;
  const [low, high] = band(input.crop);
  const plausible = (v: number | null) => v !== null && v >= low && v <= high;
  const crop = input.crop ?? 'corn';

  const finite = values.filter(Number.isFinite);
  const m = finite.length > 0 ? sampleMedian(finite) : NaN;
  const yieldUnit = yieldUnitFromValues(m, usHints);
  const massUnit: MassUnit = usHints ? 'lb' : 'kg';
  const asYield = Number.isFinite(m) ? convertYield(m, yieldUnit, crop) : null;
  const asWeight =
    Number.isFinite(m) && plotAreaM2 !== null && plotAreaM2 > 0
      ? plotWeightToKgHa(m, massUnit, plotAreaM2, 'm2')
      : null;
  const area = plotAreaM2 === null ? '' : `${Number(plotAreaM2.toPrecision(3))} m²`;
  const readings: ColumnReading[] = [
    {
      role: 'plotWeight',
      unit: massUnit,
      medianYieldKgHa: asWeight,
      meaning: `plot weights in ${massUnit}${area ? ` over plots of ${area}` : ''}`,
    },
    { role: 'yield', unit: yieldUnit, medianYieldKgHa: asYield, meaning: `yields in ${yieldUnit}` },
  ];
  const near = Number.isFinite(m) ? `values near ${Number(m.toPrecision(3))}` : 'no values';
  const says = (r: ColumnReading) =>
    r.medianYieldKgHa === null
      ? `${r.meaning} (no plot area to convert them)`
      : `${kgHa(r.medianYieldKgHa)} if ${r.meaning}`;
  const ask = (why: string): WeightOrYieldDecision => ({
    role: weightWord ? 'plotWeight' : 'yield',
    unit: weightWord ? massUnit : yieldUnit,
    evidence: [why],
    question: { readings, why: `${why}: ${readings.map(says).join('; ')}` },
  });
  const take = (r: ColumnReading, why: string): WeightOrYieldDecision => ({
    role: r.role,
    unit: r.unit,
    evidence: [why],
    question: null,
  });

  const [weightReading, yieldReading] = readings;
  if (weightWord) {
    if (plotAreaM2 === null)
      return take(weightReading, `no unit in the header; taken as ${massUnit}`);
    if (plausible(asWeight))
      return take(
        weightReading,
        `no unit in the header; with the sheet's plot size, ${near} give ${kgHa(asWeight!)} as ${weightReading.meaning}`,
      );
    if (plausible(asYield))
      return ask(
        `header word "${weightWord}" says plot weight, but the ${near} only make sense as yields`,
      );
    return take(weightReading, `no unit in the header; taken as ${massUnit}`);
  }
  // Named a yield (yield, yld, grain) with no unit.
  if (plotAreaM2 === null || !Number.isFinite(m))
    return take(yieldReading, `no unit in the header; ${near} read as ${yieldUnit}`);
  if (plausible(asYield) && plausible(asWeight))
    return ask(
      `the header names no unit and the sheet has plot sizes, so the ${near} could be plot weights or yields`,
    );
  if (plausible(asWeight))
    return ask(`the header says yield, but the ${near} only make sense as plot weights`);
  return take(
    yieldReading,
    `no unit in the header; ${near} read as ${yieldUnit} (as plot weights they would give ${kgHa(asWeight!)}, no yield of the crop)`,
  );
}
