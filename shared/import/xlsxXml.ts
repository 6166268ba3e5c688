/**
 * The small pieces of SpreadsheetML (ECMA-376 Part 1, §18) the workbook reader needs: tag
 * attributes, XML character references, the format's own _xHHHH_ escapes, cell addresses and
 * which number formats show dates. Plain string scanning: the parts Plotrate reads are flat.
 */

/**
 * The attributes of one start tag's inside, name → unescaped value.
 * @param inside - the text between the tag name and its closing ">"
 * @returns the attributes (namespace prefixes kept: "r:id")
 * @example
 * attributes(' r="B2" s="3" t="s"') // { r: 'B2', s: '3', t: 's' }
 */
export function attributes(inside: string): Record<string, string> {
  const out: Record<string, string> = {};
  const re = /([\w:.-]+)\s*=\s*(?:"([^"]*)"|'([^']*)')/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(inside))) out[m[1]] = unescapeXml(m[2] ?? m[3] ?? '');
  return out;
}

const NAMED: Record<string, string> = { lt: '<', gt: '>', amp: '&', quot: '"', apos: "'" };

/**
 * Text with XML's character references replaced (the five named ones and numeric ones).
 * @param text - element or attribute text as stored
 * @returns the text it stands for
 * @example
 * unescapeXml('N &amp; P &#8211; 2024') // 'N & P – 2024'
 */
export function unescapeXml(text: string): string {
  if (!text.includes('&')) return text;
  return text.replace(/&(#x[0-9a-fA-F]+|#\d+|lt|gt|amp|quot|apos);/g, (_, ref: string) => {
    if (ref[0] !== '#') return NAMED[ref];
    const code = ref[1] === 'x' ? parseInt(ref.slice(2), 16) : parseInt(ref.slice(1), 10);
    return code <= 0x10ffff ? String.fromCodePoint(code) : '';
  });
}

/**
 * A cell string with SpreadsheetML's escapes of characters XML cannot hold (ECMA-376 Part 1,
 * §22.9.2.19 ST_Xstring: "_x000D_" is a carriage return, "_x005F_" an underscore).
 * @param text - string text after unescapeXml
 * @returns the string the user typed
 * @example
 * unescapeXstring('Plot_x000D_') // 'Plot\r'
 */
export function unescapeXstring(text: string): string {
  if (!text.includes('_x')) return text;
  return text.replace(/_x([0-9A-Fa-f]{4})_/g, (_, hex: string) =>
    String.fromCharCode(parseInt(hex, 16)),
  );
}

/**
 * The text of a string item (a shared string's <si> or an inline <is>): the <t> runs joined,
 * phonetic guides (<rPh>) left out, as a spreadsheet shows it.
 * @param inner - the item's inner XML
 * @param prefix - the namespace prefix of the part's elements ("" or e.g. "x:")
 * @returns the text
 * @example
 * stringItemText('<r><t>Yield </t></r><r><t>(t/ha)</t></r>', '') // 'Yield (t/ha)'
 */
export function stringItemText(inner: string, prefix: string): string {
  const body = inner.includes('rPh')
    ? inner.replace(new RegExp(`<${prefix}rPh\\b[\\s\\S]*?</${prefix}rPh>`, 'g'), '')
    : inner;
  const re = new RegExp(`<${prefix}t(?:\\s[^>]*)?(?:/>|>([\\s\\S]*?)</${prefix}t>)`, 'g');
  let text = '';
  let m: RegExpExecArray | null;
  while ((m = re.exec(body))) text += m[1] ?? '';
  return unescapeXstring(unescapeXml(text));
}

/**
 * The built-in number formats a reader must know by id (ECMA-376 Part 1, §18.8.30): those
 * that fix decimals, and those that show dates or times. Others are "General" for Plotrate.
 */
const BUILT_IN_FORMATS: Record<number, string> = {
  1: '0',
  2: '0.00',
  3: '#,##0',
  4: '#,##0.00',
  14: 'mm-dd-yy',
  15: 'd-mmm-yy',
  16: 'd-mmm',
  17: 'mmm-yy',
  18: 'h:mm AM/PM',
  19: 'h:mm:ss AM/PM',
  20: 'h:mm',
  21: 'h:mm:ss',
  22: 'm/d/yy h:mm',
  45: 'mm:ss',
  46: '[h]:mm:ss',
  47: 'mmss.0',
};

/** Ids the standard reserves for dates in East Asian locales (§18.8.30): dates whatever their code. */
const LOCALE_DATE_IDS = new Set([
  27, 28, 29, 30, 31, 32, 33, 34, 35, 36, 50, 51, 52, 53, 54, 55, 56, 57, 58,
]);

/**
 * The format code of a number format id, from the workbook's own list or the built-in ones.
 * @param id - numFmtId of a cell style
 * @param custom - the workbook's <numFmt> codes by id
 * @returns the code, or undefined for General
 */
export function formatCode(id: number, custom: ReadonlyMap<number, string>): string | undefined {
  if (custom.has(id)) return custom.get(id);
  if (LOCALE_DATE_IDS.has(id)) return 'yyyy-mm-dd';
  return BUILT_IN_FORMATS[id];
}

/**
 * Whether a number format shows its number as a date or time: any of y m d h s left after
 * quoted text, escaped characters and [bracketed] colours or conditions are removed.
 * @param code - a format code
 * @returns true for date and time formats
 * @example
 * isDateFormat('dd/mm/yyyy') // true
 * isDateFormat('0.0 "kg"') // false
 */
export function isDateFormat(code: string | undefined): boolean {
  if (!code) return false;
  const bare = code
    .replace(/"[^"]*"/g, '')
    .replace(/\\./g, '')
    .replace(/\[[^\]]*\]/g, '');
  return /[ymdhs]/i.test(bare) && !/^general$/i.test(bare.trim());
}

/**
 * The date a spreadsheet serial number stands for, at UTC midnight plus the fraction of a day.
 * Serial 25569 is 1970-01-01 in the 1900 system; the 1904 system starts 1462 days later
 * (ECMA-376 Part 1, §18.17.4). Dates before March 1900 (where the 1900 system counts a
 * 29 February that never was) are not trial dates and are not corrected.
 * @param serial - the cell's number
 * @param date1904 - whether the workbook uses the 1904 system
 * @returns the date
 * @example
 * serialDate(45658, false).toISOString() // '2025-01-01T00:00:00.000Z'
 */
export function serialDate(serial: number, date1904: boolean): Date {
  return new Date(Math.round((serial - 25569 + (date1904 ? 1462 : 0)) * 86_400_000));
}
