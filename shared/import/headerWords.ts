/**
 * What a header's words say about a column: its role and its unit. The word
 * lists are the trade's usual abbreviations (trt, rep, blk, yld, moist, TW);
 * the first rule that matches wins, so "test weight" is never a plot weight
 * and "plot area" is never a plot number. Grouping words come before the rate
 * words so that "Soil N" is a grouping column, not a rate.
 */
import { productFromText, type ProductId } from '../units/products';
import type { HeaderUnit, MappedRole } from './columnMapping';

/**
 * "UAN" in a header: a product whose grade (28 or 32 % N) productFromText does not guess from the
 * name alone, so its rates are of a product to be named.
 */
const UAN_WITHOUT_GRADE = /\buan\b/;

const rules: [Exclude<MappedRole, 'ignore'>, RegExp][] = [
  [
    'exclude',
    /\b(exclude[sd]?|exclusions?|omit(ted)?|drop(ped)?|discard(ed)?|ignore[d]?|use\?|keep\?)\b/,
  ],
  ['notes', /\b(notes?|comments?|remarks?|observations?)\b/],
  ['testWeight', /\btest\s*w(eigh)?t\b|\btw\b|\bbushel\s*weight\b|\bhectol(it|et)re?\b|\bhlw\b/],
  ['moisture', /\bmoist(ure)?\b|\bh2o\b|\bmc\b|\bwater\s*content\b/],
  ['yield', /\byield\b|\byld\b|\bgrain\b(?!\s*(w(eigh)?t|mass))/],
  ['plotWeight', /\b(w(eigh)?t|mass)\b/],
  ['plotArea', /\barea\b/],
  ['plotLength', /\b(length|len)\b/],
  ['plotWidth', /\bwidth\b/],
  [
    'group',
    /\b(previous|prev|prior|preceding)\s*crop\b|\brotation\b|\bsoil\b|\btexture\b|\btillage\b|\bhybrid\b|\bvariety\b|\bcultivar\b|\birrigat|\bdrainage\b|\bregion\b|\bzone\b|\bmanagement\b/,
  ],
  ['rate', /\b(rate|dose|applied|n|nitrogen|total\s*n)\b/],
  ['treatment', /\b(trt|trts|treat|treatment|treatments|tmt|entry)\b|^t$/],
  ['block', /\b(block|blk|blocks|rep|reps|replicate|replication|bloc)\b/],
  ['plot', /\bplot\b|\bplot\s*(no|#|id|number)\b|^plt$/],
  ['site', /\b(site|location|loc|field|farm|station)\b/],
  ['year', /\b(year|yr|season)\b/],
  ['factor', /\b(placement|application\s*method)\b/],
  ['timing', /\b(timing|stage|application\s*time)\b/],
  ['product', /\b(source|product|fertili[sz]er|form)\b/],
];

/**
 * Normalizes header text for matching: lower case, one space, no line breaks.
 * @param header - the cell text
 * @returns the normalized text
 * @example
 * normalizeHeader('Grain\nYield  (bu/A)') // 'grain yield (bu/a)'
 */
export function normalizeHeader(header: string): string {
  return header.toLowerCase().replace(/\s+/g, ' ').replace(/²/g, '2').trim();
}

/**
 * The role a header names, or null.
 * @param header - the header text
 * @returns the role and the words that decided it
 * @example
 * roleFromHeader('Rep') // { role: 'block', word: 'rep' }
 */
export function roleFromHeader(
  header: string,
): { role: Exclude<MappedRole, 'ignore'>; word: string } | null {
  // The unit in brackets says nothing about the role ("lb N/ac" must not make a yield a rate).
  const h = normalizeHeader(header)
    .replace(/[([{].*?[)\]}]/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
  for (const [role, re] of rules) {
    const m = re.exec(h);
    if (m) return { role, word: m[0].trim() };
  }
  // Units alone can name a role: "lb N/ac" is a rate, "bu/ac" a yield, "%" next to nothing is not enough.
  const u = unitFromHeader(header);
  if (u?.unit === 'bu/ac' || u?.unit === 't/ha') return { role: 'yield', word: u.text };
  if (u?.basis) return { role: 'rate', word: u.text };
  // A product per area is its rate: "Urea (lb/ac)", "UAN 32 kg/ha", "UAN (lb/ac)".
  const namesProduct = productFromText(h) !== null || UAN_WITHOUT_GRADE.test(h);
  if (namesProduct && (u?.unit === 'lb/ac' || u?.unit === 'kg/ha'))
    return { role: 'rate', word: `${h} ${u.text}` };
  return null;
}

/** What a rate column's header says of its rates (rateHeaderBasis). */
export interface RateHeaderBasis {
  /** Of product, of nutrient, or null when the header does not say. */
  basis: 'product' | 'nutrient' | null;
  /** The product the header names, for rates of product; null when it names none. */
  product: ProductId | null;
}

/**
 * Whether a rate column's header says its rates are of nutrient or of product, and which
 * product: the one owner of this reading, for detection and for a role given by hand. The unit
 * says it first ("lb N/ac", "kg urea/ha"), then the words outside brackets: "product", then N or
 * nitrogen ("Urea N" is nitrogen from urea), then a product's name ("Urea (lb/ac)"); "UAN" with
 * no grade is a product left unnamed, so its N content is asked for.
 * @param header - the header text
 * @returns the basis and the product
 * @example
 * rateHeaderBasis('Urea (lb/ac)') // { basis: 'product', product: 'urea' }
 * rateHeaderBasis('N rate (lb/ac)') // { basis: 'nutrient', product: null }
 */
export function rateHeaderBasis(header: string): RateHeaderBasis {
  const h = normalizeHeader(header);
  const outside = h.replace(/[([{].*?[)\]}]/g, ' ');
  const u = unitFromHeader(header);
  const named =
    productFromText(outside) ?? (u?.basis === 'product' ? productFromText(u.text) : null);
  const family = UAN_WITHOUT_GRADE.test(outside);
  const basis =
    u?.basis ??
    (/\bproduct\b/.test(h)
      ? 'product'
      : /\b(n|nitrogen)\b/.test(outside)
        ? 'nutrient'
        : named || family
          ? 'product'
          : null);
  return { basis, product: basis === 'product' && named ? named.id : null };
}

export interface UnitHint {
  unit: HeaderUnit;
  /** For per-area rates: the header names the nutrient ("lb N/ac") or a product. */
  basis: 'product' | 'nutrient' | null;
  /** The words the unit was read from. */
  text: string;
}

/**
 * The unit a header names, if any.
 * @param header - the header text, e.g. "N rate (lb N/A)", "Yield t/ha", "Moisture %"
 * @returns the unit, whether it names the nutrient, and the words it came from
 * @example
 * unitFromHeader('N rate (lb N/A)') // { unit: 'lb/ac', basis: 'nutrient', text: 'lb n/a' }
 */
export function unitFromHeader(header: string): UnitHint | null {
  const h = normalizeHeader(header);
  // Every "<mass> [word] / <area>" in the header is tried until one is a known unit.
  const perAreaRe =
    /\b(lbs?|pounds?|kg|g|t|mg|tonnes?|tons?|q|qt|qtl|quintals?|dt|bu|bushels?)\.?\s*(?:of\s*)?([a-z0-9]*)\s*(?:\/|per)\s*(ac|acre|a|ha|hectare|m2|sq\.? ?m)\b/g;
  for (const perArea of h.matchAll(perAreaRe)) {
    const [text, massWord, middle, areaWord] = perArea;
    const perHa = areaWord === 'ha' || areaWord === 'hectare';
    const perM2 = areaWord.startsWith('m2') || areaWord.startsWith('sq');
    const mid = middle.trim();
    const basis: UnitHint['basis'] =
      mid === 'n' || mid === 'nitrogen'
        ? 'nutrient'
        : mid === 'product' || (mid !== '' && productFromText(mid) !== null)
          ? 'product'
          : null;
    let unit: HeaderUnit | null = null;
    if (/^(bu|bushels?)$/.test(massWord)) unit = perHa || perM2 ? null : 'bu/ac';
    else if (/^(lbs?|pounds?)$/.test(massWord)) unit = perHa || perM2 ? null : 'lb/ac';
    else if (massWord === 'kg') unit = perHa ? 'kg/ha' : null;
    else if (massWord === 'g') unit = perM2 ? 'g/m2' : null;
    else if (/^(t|mg|tonnes?|tons?)$/.test(massWord)) unit = perHa ? 't/ha' : null;
    else if (/^(q|qt|qtl|quintals?|dt)$/.test(massWord)) unit = perHa ? 'q/ha' : null;
    if (unit) return { unit, basis, text };
  }
  // A mass per plot ("kg/plot", "lb per plot") is a plot weight's unit.
  const perPlot = /\b(kg|g|lbs?|pounds?)\.?\s*(?:\/|per)\s*plot\b/.exec(h);
  if (perPlot) {
    const m = perPlot[1];
    return { unit: m === 'kg' ? 'kg' : m === 'g' ? 'g' : 'lb', basis: null, text: perPlot[0] };
  }
  if (/\bbpa\b/.test(h)) return { unit: 'bu/ac', basis: null, text: 'bpa' };
  if (/\blb\s*\/\s*bu\b/.test(h)) return { unit: 'lb/bu', basis: null, text: 'lb/bu' };
  if (/\bkg\s*\/\s*hl\b/.test(h)) return { unit: 'kg/hl', basis: null, text: 'kg/hl' };
  if (/%|\bpercent\b|\bpct\b/.test(h)) return { unit: '%', basis: null, text: '%' };
  const bracket = /[([]\s*([a-z0-9. ]+?)\s*[)\]]/.exec(h)?.[1] ?? '';
  const tail =
    bracket || (/\b(kg|g|lbs?|m2|ft2|sq\.? ?ft|sq\.? ?m|ha|ac|m|ft)\s*$/.exec(h)?.[1] ?? '');
  const simple: Record<string, HeaderUnit> = {
    kg: 'kg',
    g: 'g',
    lb: 'lb',
    lbs: 'lb',
    m2: 'm2',
    'sq m': 'm2',
    'sq. m': 'm2',
    sqm: 'm2',
    ft2: 'ft2',
    'sq ft': 'ft2',
    'sq. ft': 'ft2',
    sqft: 'ft2',
    ha: 'ha',
    ac: 'ac',
    m: 'm',
    ft: 'ft',
  };
  if (simple[tail]) return { unit: simple[tail], basis: null, text: tail };
  return null;
}
