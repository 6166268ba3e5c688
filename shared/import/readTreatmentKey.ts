/**
 * The treatment key: a sheet that gives, per treatment label, its rate (with unit and basis),
 * product and timing, for plot sheets that carry only the treatment.
 */
import { cellAddress, cellRef } from '../table/cellAddress';
import type { OriginalCell } from '../table/plotTable';
import type { RateUnit } from '../units/convertRate';
import { productFromText, type FertilizerProduct } from '../units/products';
import type { QualityFinding } from '../table/qualityFinding';
import { cellLabel, cellText } from './cellLabel';
import { cellNumber } from './cellNumber';
import { columnForRole, type MappedRole, type SheetMapping } from './columnMapping';
import type { RawSheet, RawWorkbook } from './rawWorkbook';

/** One treatment of the key. */
export interface TreatmentKeyEntry {
  /** The rate as written, in rateUnit and on the basis; null when the cell has no number. */
  rate: number | null;
  rateUnit: RateUnit;
  basis: 'product' | 'nutrient' | null;
  /** The product named in the key, or null when none is named or it is not known. */
  product: FertilizerProduct | null;
  productText: string;
  timing: string;
  /** The rate's cell, kept as the plot's original rate; null when the key has no rate column. */
  rateCell: OriginalCell | null;
}

/**
 * Reads a treatment-key sheet.
 * @param raw - the workbook (for its file name)
 * @param sheet - the key sheet
 * @param m - the sheet's mapping (treatment, rate, product, timing columns)
 * @param findings - receives a note for each rate stored as text
 * @returns the entries by treatment label; empty when no column is the treatment
 * @example
 * readTreatmentKey(raw, keySheet, keyMapping, findings).get('T3')?.rate // e.g. 120
 */
export function readTreatmentKey(
  raw: RawWorkbook,
  sheet: RawSheet,
  m: SheetMapping,
  findings: QualityFinding[],
): Map<string, TreatmentKeyEntry> {
  const key = new Map<string, TreatmentKeyEntry>();
  const col = (role: MappedRole) => columnForRole(m.columns, role);
  const trt = col('treatment');
  const rate = col('rate');
  const product = col('product');
  const timing = col('timing');
  if (!trt) return key;
  for (let r = m.headerRow + 1; r <= sheet.rows.length; r++) {
    const row = sheet.rows[r - 1] ?? [];
    const t = cellLabel(row[trt.col - 1]);
    if (t === null) continue;
    const rc = rate ? row[rate.col - 1] : null;
    const n = rate
      ? cellNumber(rc, sheet.decimalComma)
      : { value: null, status: 'missing' as const };
    if (n.status === 'number-as-text' && rc) {
      findings.push({
        code: 'number-as-text',
        severity: 'info',
        message: `The rate in ${sheet.name} ${cellAddress(r, rate!.col)} is a number stored as text ("${rc.text}"); it was read as ${n.value}.`,
        refs: [cellRef(raw.file.name, sheet.name, r, rate!.col)],
      });
    }
    const pText = product ? cellText(row[product.col - 1]) : '';
    key.set(t, {
      rate: n.value,
      rateUnit: (rate?.unit as RateUnit) ?? 'kg/ha',
      basis: rate?.basis ?? null,
      product: pText ? productFromText(pText) : null,
      productText: pText,
      timing: timing ? cellText(row[timing.col - 1]) : '',
      rateCell: rate
        ? { text: rc?.text ?? '', file: raw.file.name, sheet: sheet.name, row: r, col: rate.col }
        : null,
    });
  }
  return key;
}
