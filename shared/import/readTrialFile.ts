/**
 * The entry to import: bytes of a trial file in, a RawWorkbook out, or an
 * ImportError that tells the user what to do. Never writes anything.
 */
import { ImportError, isImportError } from './importError';
import { formatBytes, importLimits, type ImportLimits } from './importLimits';
import { decodeText } from './decodeText';
import { readDelimited } from './readDelimited';
import { sha256Hex } from './sha256Hex';
import { sniffFormat } from './sniffFormat';
import type { RawWorkbook } from './rawWorkbook';

export interface TrialFileInput {
  /** File name as the user chose it; directories are dropped from messages. */
  name: string;
  bytes: Uint8Array;
}

/**
 * Reads a trial file (.xlsx, .csv, .tsv or .txt).
 * @param input - the file's name and bytes
 * @param limits - caps on file size, unzipped size and rows (defaults: {@link importLimits})
 * @returns the workbook's sheets and cells
 * @throws {ImportError} for an empty, legacy (.xls), OpenDocument, password-protected,
 *   damaged or oversized file, each with a message saying what to do
 * @example
 * const raw = await readTrialFile({ name: 'trial.csv', bytes });
 * raw.sheets[0].rows[0][0]?.text // 'Site'
 */
export async function readTrialFile(
  input: TrialFileInput,
  limits: Partial<ImportLimits> = {},
): Promise<RawWorkbook> {
  const lim: ImportLimits = { ...importLimits, ...limits };
  const name = input.name.split(/[\\/]/).pop() ?? input.name;
  const bytes = input.bytes;
  if (bytes.length > lim.maxFileBytes) {
    throw new ImportError(
      'file-too-large',
      `"${name}" is ${formatBytes(bytes.length)}, more than the limit of ${formatBytes(lim.maxFileBytes)} for one file; a trial workbook is usually under 5 MB. Split it by site or year.`,
      { file: name },
    );
  }
  try {
    const format = sniffFormat(name, bytes);
    const file = { name, bytes: bytes.length, sha256: await sha256Hex(bytes) };
    if (format === 'xlsx') {
      // Imported here: a .csv never needs the workbook reader.
      const { readXlsx } = await import('./readXlsx');
      return await readXlsx(file, bytes, lim);
    }
    return readDelimited(file, decodeText(bytes).text, lim);
  } catch (e) {
    if (isImportError(e)) throw e;
    // Any other failure is a file we could not understand; the user still gets a sentence.
    const why = e instanceof Error ? e.message.split('\n')[0].slice(0, 160) : String(e);
    throw new ImportError(
      'corrupt',
      `"${name}" could not be read (${why}); open it in your spreadsheet program, save it again as .xlsx or .csv and import that copy.`,
      { file: name },
    );
  }
}
