/**
 * The limits import holds every file to, so that a hostile or accidental file
 * (a zip bomb, a sheet of a million rows) is refused with a message instead of
 * exhausting memory. Each can be raised by the caller; each message names it.
 */

export interface ImportLimits {
  /** Largest file accepted, bytes. */
  maxFileBytes: number;
  /**
   * Largest total size of an .xlsx's contents once unzipped, bytes. 96 MiB keeps a workbook at
   * every other cap inside 1 GB: 250,000 plots × 8 columns with a note on each, 94 MiB of sheet
   * XML, peaked at 906–935 MiB through `plotrate analyze`, and 233 MB of XML at 1.41 GiB. A trial
   * workbook of 50,000 plots (the seeded generator's, 7 columns) unzips to 12 MiB.
   */
  maxUncompressedBytes: number;
  /** Most rows accepted in one sheet or CSV file. */
  maxRows: number;
  /**
   * Most columns read in one sheet: a cell beyond is refused, naming it. Trial sheets use a few
   * dozen; a stray value far right would otherwise widen every row.
   */
  maxColumns: number;
  /**
   * Most characters in one cell or CSV field. 32,767 is the most a worksheet cell holds in
   * Microsoft Excel since Excel 97 (Microsoft KB 211878, "Worksheet cells can contain a maximum
   * of 32,767 characters"); a field longer than that cannot have come from a spreadsheet and
   * is usually a lost line break or a stray quote.
   */
  maxCellChars: number;
  /**
   * Most filled cells read from one file, all sheets together. What keeps any file within the
   * caps inside 1 GB: the rows and columns caps alone allow 256 million cells. A distinct cell
   * costs about 106 bytes read (measured: 5 million distinct number cells took 532 MB of heap)
   * and each plot of the table about 1.6 KB more while both are held, so 2 million cells
   * (250,000 plots × 8 columns, or 100,000 × 20) stay inside 1 GB with the table beside them.
   */
  maxCells: number;
  /** Most entries accepted inside an .xlsx zip. */
  maxZipEntries: number;
  /**
   * Largest expansion of one zip part, unzipped ÷ zipped, checked once the part
   * passes 8 MiB unzipped. Worksheet XML deflates about 5–50×; a zip bomb nears
   * deflate's limit of about 1032×, so this refuses one after a few MB of work.
   */
  maxCompressionRatio: number;
}

/**
 * Defaults sized for trial sheets: a trial of 10 000 plots is a few MB; these
 * leave a wide margin while keeping a workbook's unzipped XML and the cells read from it
 * well inside a desktop's RAM.
 */
export const importLimits: Readonly<ImportLimits> = {
  maxFileBytes: 64 * 1024 * 1024,
  maxUncompressedBytes: 96 * 1024 * 1024,
  maxRows: 250_000,
  maxColumns: 1_024,
  maxCellChars: 32_767,
  maxCells: 2_000_000,
  maxZipEntries: 2_000,
  maxCompressionRatio: 400,
};

/**
 * Formats a byte count for a message ("64 MiB").
 * @param bytes - a size, bytes
 * @returns the size in B, KiB, MiB or GiB
 * @example
 * formatBytes(64 * 1024 * 1024) // '64 MiB'
 */
export function formatBytes(bytes: number): string {
  const units = ['B', 'KiB', 'MiB', 'GiB'];
  let v = bytes;
  let i = 0;
  while (v >= 1024 && i < units.length - 1) {
    v /= 1024;
    i++;
  }
  return `${Number.isInteger(v) ? v : v.toFixed(1)} ${units[i]}`;
}
