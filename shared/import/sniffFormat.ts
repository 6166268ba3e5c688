/**
 * Tells from a file's first bytes (never from its name alone) what it is, so a
 * legacy .xls, an .ods or a password-protected workbook gets a message that
 * says how to fix it instead of a parser's stack trace.
 *
 * Magic numbers: zip local header "PK\x03\x04" (PKWARE APPNOTE 4.3.7); OLE2
 * compound file D0 CF 11 E0 A1 B1 1A E1 ([MS-CFB] 2.2). An encrypted OOXML
 * file is an OLE2 file holding a stream named "EncryptedPackage"
 * ([MS-OFFCRYPTO] 2.3.4.4); a legacy workbook holds "Workbook" or "Book".
 */
import { ImportError } from './importError';
import { zipEntryNames } from './zipGuard';

export type SniffedFormat = 'xlsx' | 'text';

const ole2 = [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1];

function startsWith(bytes: Uint8Array, magic: readonly number[]): boolean {
  if (bytes.length < magic.length) return false;
  return magic.every((b, i) => bytes[i] === b);
}

function containsUtf16(bytes: Uint8Array, word: string): boolean {
  const pattern = new Uint8Array(word.length * 2);
  for (let i = 0; i < word.length; i++) pattern[i * 2] = word.charCodeAt(i);
  outer: for (let i = 0; i + pattern.length <= bytes.length; i++) {
    if (bytes[i] !== pattern[0]) continue;
    for (let j = 1; j < pattern.length; j++) if (bytes[i + j] !== pattern[j]) continue outer;
    return true;
  }
  return false;
}

/**
 * Classifies a file as an .xlsx workbook or as text, or refuses it.
 * @param name - the file name, for messages
 * @param bytes - the whole file
 * @returns "xlsx" or "text"
 * @throws {ImportError} "empty-file", "legacy-xls", "encrypted", "ods", "not-a-workbook"
 * @example
 * sniffFormat('a.csv', new TextEncoder().encode('plot,yield\n1,200')) // 'text'
 */
export function sniffFormat(name: string, bytes: Uint8Array): SniffedFormat {
  const where = { file: name };
  if (bytes.length === 0) {
    throw new ImportError(
      'empty-file',
      `"${name}" is empty (0 bytes); choose the saved trial file.`,
      where,
    );
  }
  if (startsWith(bytes, ole2)) {
    if (containsUtf16(bytes, 'EncryptedPackage')) {
      throw new ImportError(
        'encrypted',
        `"${name}" is protected with a password. Open it in your spreadsheet program, remove the password (File › Info › Protect Workbook), save it as .xlsx and import that copy.`,
        where,
      );
    }
    if (containsUtf16(bytes, 'Workbook') || containsUtf16(bytes, 'Book')) {
      throw new ImportError(
        'legacy-xls',
        `"${name}" is a legacy Excel 97–2003 file (.xls); open it and save as .xlsx (Excel Workbook), then import the .xlsx.`,
        where,
      );
    }
    throw new ImportError(
      'not-a-workbook',
      `"${name}" is an old Office file but not a workbook; import an .xlsx, .csv or .tsv file.`,
      where,
    );
  }
  if (startsWith(bytes, [0x50, 0x4b, 0x03, 0x04]) || startsWith(bytes, [0x50, 0x4b, 0x05, 0x06])) {
    const names = zipEntryNames(name, bytes);
    if (names.includes('xl/workbook.xml')) return 'xlsx';
    if (names.includes('mimetype') && names.includes('content.xml')) {
      throw new ImportError(
        'ods',
        `"${name}" is an OpenDocument spreadsheet (.ods); open it and save as .xlsx (Excel 2007–365), then import the .xlsx.`,
        where,
      );
    }
    const kind = names.some((n) => n.startsWith('word/'))
      ? 'a Word document'
      : names.some((n) => n.startsWith('ppt/'))
        ? 'a PowerPoint file'
        : 'a zip archive without a workbook inside';
    throw new ImportError(
      'not-a-workbook',
      `"${name}" is ${kind}, not a trial workbook; import an .xlsx, .csv or .tsv file.`,
      where,
    );
  }
  if (startsWith(bytes, [0x25, 0x50, 0x44, 0x46])) {
    throw new ImportError(
      'not-a-workbook',
      `"${name}" is a PDF; import the spreadsheet the PDF was made from (.xlsx, .csv or .tsv).`,
      where,
    );
  }
  const hasUtf16Bom =
    (bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff);
  if (!hasUtf16Bom) {
    const head = bytes.subarray(0, 4096);
    let controls = 0;
    for (const b of head) {
      if (b === 0) {
        throw new ImportError(
          'not-a-workbook',
          `"${name}" is neither a workbook nor a text file (it holds binary data); import an .xlsx, .csv or .tsv file.`,
          where,
        );
      }
      if (b < 0x09 || (b > 0x0d && b < 0x20 && b !== 0x1b)) controls++;
    }
    if (controls > head.length / 20) {
      throw new ImportError(
        'not-a-workbook',
        `"${name}" is neither a workbook nor a text file (it holds binary data); import an .xlsx, .csv or .tsv file.`,
        where,
      );
    }
  }
  // Web systems often export an HTML table or the 2003 XML format under an .xls name.
  const start = new TextDecoder('utf-8', { fatal: false })
    .decode(bytes.subarray(0, 2048))
    .replace(/^\ufeff/, '')
    .trimStart()
    .toLowerCase();
  if (start.startsWith('<')) {
    const kind = /urn:schemas-microsoft-com:office:spreadsheet/.test(start)
      ? 'an Excel 2003 XML spreadsheet'
      : /<html|<table|<!doctype html/.test(start)
        ? 'a web page (HTML) saved under a spreadsheet name'
        : 'an XML or HTML file';
    throw new ImportError(
      'not-a-workbook',
      `"${name}" is ${kind}, not a trial workbook; open it in your spreadsheet program and save it as .xlsx, then import that.`,
      where,
    );
  }
  // Text under a workbook's name is more often a damaged or half-copied file than
  // a renamed CSV; guessing would turn it into "no plot rows found".
  if (/\.xls[xm]$/i.test(name)) {
    throw new ImportError(
      'not-a-workbook',
      `"${name}" is named as an .xlsx workbook but holds plain text, not a workbook: it is damaged or was renamed. If it is a CSV export, rename it to .csv; otherwise save it again as .xlsx from your spreadsheet program.`,
      where,
    );
  }
  return 'text';
}
