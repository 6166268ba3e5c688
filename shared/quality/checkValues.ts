/**
 * Plot-by-plot checks of single values: text where a number belongs, negative
 * numbers, yields above the crop's plausible bound, moistures outside a range.
 */
import { originalRef } from '../table/originalCell';
import {
  impossibleValue,
  MAX_POSSIBLE_RATE_KG_HA,
  MAX_POSSIBLE_YIELD_KG_HA,
  NUMERIC_COLUMN_ROLES,
  type Plot,
  type PlotTable,
} from '../table/plotTable';
import { crops } from '../units/crops';
import { yieldFromKgHa } from '../units/convertYield';
import { isMissingMarker, parseNumberText } from '../table/parseNumberText';
import { describeRef, quoteCellText, type QualityFinding } from '../table/qualityFinding';
import { siteYearsOf } from '../table/siteYear';

function isNumberText(text: string): boolean {
  return parseNumberText(text, false) !== null || parseNumberText(text, true) !== null;
}

/**
 * Checks every plot's values.
 * @param table - the plot table
 * @param moistureRangePct - [low, high] harvest moisture accepted, % (default 5–40)
 * @returns findings with the cells concerned
 * @example
 * checkValues(table, [5, 40]).filter((f) => f.code === 'not-a-number')
 */
export function checkValues(
  table: PlotTable,
  moistureRangePct: [number, number],
): QualityFinding[] {
  const out: QualityFinding[] = [];
  const crop = crops(table.crop);
  const { nameOf } = siteYearsOf(table);
  const finding = (p: Plot, f: Omit<QualityFinding, 'site' | 'plotIds'>) =>
    out.push({ ...f, site: nameOf(p), plotIds: [p.id] });
  for (const p of table.plots) {
    for (const role of NUMERIC_COLUMN_ROLES) {
      const o = p.original[role];
      if (!o) continue;
      const t = o.text.trim();
      if (t === '' || isMissingMarker(t) || isNumberText(t)) continue;
      const ref = originalRef(o);
      finding(p, {
        code: 'not-a-number',
        severity: 'error',
        message: `${describeRef(ref)} should hold the ${role === 'plotWeight' ? 'plot weight' : role} as a number but says "${quoteCellText(t)}"; the plot has no ${role} until the cell is corrected.`,
        refs: [ref],
      });
    }
    if (p.original.yield && p.yieldKgHa === null && isMissingMarker(p.original.yield.text)) {
      const ref = originalRef(p.original.yield);
      finding(p, {
        code: 'missing-value',
        severity: 'info',
        message: `${describeRef(ref)}: plot ${p.plotLabel ?? ''} of ${nameOf(p)} has no yield${p.original.yield.text.trim() ? ` ("${quoteCellText(p.original.yield.text)}")` : ''}; it is left out of the fits.`,
        refs: [ref],
      });
    }
    // The table's possibility rule (impossibleValue) decides; this names the cell and the fix.
    for (const [role, v] of [
      ['yield', p.yieldKgHa],
      ['rate', p.rateKgHa],
    ] as const) {
      const why = v === null ? null : impossibleValue(role, v);
      if (v === null || why === null) continue;
      const o = role === 'yield' ? (p.original.yield ?? p.original.plotWeight) : p.original.rate;
      const ref = o ? originalRef(o) : null;
      const where = ref ? describeRef(ref) : nameOf(p);
      const shown = o?.text ?? String(v);
      const fix =
        why === 'negative'
          ? `a ${role} cannot be below zero`
          : why === 'not finite'
            ? `it is not a finite number`
            : role === 'rate'
              ? `no trial applies more than ${MAX_POSSIBLE_RATE_KG_HA.toLocaleString('en-US')} kg/ha; check the cell and the rate unit`
              : `no crop yields more than ${MAX_POSSIBLE_YIELD_KG_HA.toLocaleString('en-US')} kg/ha; check the cell and the yield unit`;
      finding(p, {
        code: why === 'negative' ? 'negative-value' : 'impossible-value',
        severity: 'error',
        message: `${where}: the ${role} ${why === 'beyond any practice' ? 'is beyond any practice' : `is ${why}`} (${shown}); ${fix}. The plot is left out of the fits until the cell is corrected.`,
        refs: ref ? [ref] : [],
      });
    }
    // A possible yield above the crop's plausible bound is kept and flagged; an impossible one was refused above.
    if (
      p.yieldKgHa !== null &&
      p.yieldKgHa > crop.maxPlausibleYieldKgHa &&
      impossibleValue('yield', p.yieldKgHa) === null
    ) {
      const o = p.original.yield ?? p.original.plotWeight;
      const ref = o ? originalRef(o) : null;
      const bu = yieldFromKgHa(p.yieldKgHa, 'bu/ac', table.crop);
      finding(p, {
        code: 'implausible-yield',
        severity: 'warning',
        message: `${ref ? describeRef(ref) : nameOf(p)}: a yield of ${Math.round(p.yieldKgHa).toLocaleString('en-US')} kg/ha (${bu.toFixed(0)} bu/ac) is above the ${Math.round(crop.maxPlausibleYieldKgHa).toLocaleString('en-US')} kg/ha plausible for ${crop.label.toLowerCase()}; check the cell and the yield unit.`,
        refs: ref ? [ref] : [],
        value: p.yieldKgHa,
      });
    }
    if (
      p.moisturePct !== null &&
      (p.moisturePct < moistureRangePct[0] || p.moisturePct > moistureRangePct[1])
    ) {
      const o = p.original.moisture;
      const ref = o ? originalRef(o) : null;
      finding(p, {
        code: 'moisture-out-of-range',
        severity: 'warning',
        message: `${ref ? describeRef(ref) : nameOf(p)}: a harvest moisture of ${p.moisturePct} % is outside ${moistureRangePct[0]}–${moistureRangePct[1]} %; check the cell (a fraction such as 0.18 should be written 18).`,
        refs: ref ? [ref] : [],
        value: p.moisturePct,
      });
    }
  }
  return out;
}
