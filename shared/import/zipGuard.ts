/**
 * Unzips an .xlsx with the checks a hostile file needs, keeping only the parts asked for: a
 * small file can inflate to gigabytes.
 *
 * Three checks: (1) the sizes the central directory declares (PKWARE APPNOTE
 * 4.3.12, 4.3.16) are summed against the cap; (2) since declared sizes can lie,
 * every entry is then inflated with fflate's streaming Inflate, counting the
 * bytes as they come out and stopping at the cap; parts not asked for are
 * discarded chunk by chunk, so memory stays at one chunk's output however large
 * the bomb; (3) each part's CRC-32 (APPNOTE 4.4.7) must match the directory's,
 * so a damaged file is refused rather than read wrong.
 */
import { Inflate } from 'fflate';
import { ImportError } from './importError';
import { formatBytes, importLimits, type ImportLimits } from './importLimits';

interface ZipEntry {
  name: string;
  method: number;
  crc32: number;
  compressedSize: number;
  declaredSize: number;
  localOffset: number;
}

function u16(b: Uint8Array, i: number): number {
  return b[i] | (b[i + 1] << 8);
}
function u32(b: Uint8Array, i: number): number {
  return (b[i] | (b[i + 1] << 8) | (b[i + 2] << 16) | (b[i + 3] << 24)) >>> 0;
}

function corrupt(name: string, why: string): ImportError {
  return new ImportError(
    'corrupt',
    `"${name}" looks like an .xlsx workbook but is damaged (${why}); open it in your spreadsheet program, save a fresh copy as .xlsx and import that.`,
    { file: name },
  );
}

function readEntries(name: string, bytes: Uint8Array, maxEntries: number): ZipEntry[] {
  // End of central directory record: signature 0x06054b50, within the last 65 557 bytes.
  let eocd = -1;
  for (let i = bytes.length - 22; i >= Math.max(0, bytes.length - 65557); i--) {
    if (u32(bytes, i) === 0x06054b50) {
      eocd = i;
      break;
    }
  }
  if (eocd < 0)
    throw corrupt(name, 'the zip directory at its end is missing; the file may be cut short');
  const count = u16(bytes, eocd + 10);
  const cdSize = u32(bytes, eocd + 12);
  const cdOffset = u32(bytes, eocd + 16);
  if (count === 0xffff || cdOffset === 0xffffffff || cdSize === 0xffffffff) {
    throw new ImportError(
      'uncompressed-too-large',
      `"${name}" is a ZIP64 archive, a form used only for contents over 4 GiB or over 65 535 parts, far beyond any trial workbook; save a copy with only the trial sheets.`,
      { file: name },
    );
  }
  if (count > maxEntries) {
    throw new ImportError(
      'uncompressed-too-large',
      `"${name}" holds ${count.toLocaleString('en-US')} parts, more than the limit of ${maxEntries.toLocaleString('en-US')}; a trial workbook has a few dozen. Save a copy with only the trial sheets.`,
      { file: name },
    );
  }
  if (cdOffset + cdSize > bytes.length)
    throw corrupt(name, 'the zip directory points past the end of the file');
  const entries: ZipEntry[] = [];
  let p = cdOffset;
  for (let k = 0; k < count; k++) {
    if (p + 46 > bytes.length || u32(bytes, p) !== 0x02014b50) {
      throw corrupt(name, `zip directory entry ${k + 1} is unreadable`);
    }
    const nameLen = u16(bytes, p + 28);
    const extraLen = u16(bytes, p + 30);
    const commentLen = u16(bytes, p + 32);
    if (p + 46 + nameLen > bytes.length)
      throw corrupt(name, `zip directory entry ${k + 1} is cut short`);
    const entryName = new TextDecoder().decode(bytes.subarray(p + 46, p + 46 + nameLen));
    entries.push({
      name: entryName,
      method: u16(bytes, p + 10),
      crc32: u32(bytes, p + 16),
      compressedSize: u32(bytes, p + 20),
      declaredSize: u32(bytes, p + 24),
      localOffset: u32(bytes, p + 42),
    });
    p += 46 + nameLen + extraLen + commentLen;
  }
  return entries;
}

/**
 * The names of the entries in a zip file (from its central directory).
 * @param name - file name, for messages
 * @param bytes - the zip file
 * @returns entry names in directory order
 * @throws {ImportError} "corrupt" when the directory is missing or damaged
 * @example
 * zipEntryNames('a.xlsx', bytes) // ['[Content_Types].xml', 'xl/workbook.xml', …]
 */
export function zipEntryNames(name: string, bytes: Uint8Array): string[] {
  return readEntries(name, bytes, Number.MAX_SAFE_INTEGER).map((e) => e.name);
}

class CapReached extends Error {}

/** The CRC-32 table of the zip format's polynomial (0xEDB88320, reflected; APPNOTE 4.4.7). */
const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

/** Continues a CRC-32 over more bytes (start with 0xffffffff, finish with ~crc >>> 0). */
function crcUpdate(crc: number, chunk: Uint8Array): number {
  let c = crc;
  for (let i = 0; i < chunk.length; i++) c = CRC_TABLE[(c ^ chunk[i]) & 0xff] ^ (c >>> 8);
  return c;
}

/** Joins inflated chunks into one array. */
function joined(chunks: Uint8Array[], length: number): Uint8Array {
  if (chunks.length === 1) return chunks[0];
  const out = new Uint8Array(length);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.length;
  }
  return out;
}

/**
 * Unzips an .xlsx after checking it: its unzipped size against the limit, first by its declared
 * sizes, then by really inflating every entry; each entry's CRC-32; and keeps the parts asked for.
 * @param name - file name, for messages
 * @param bytes - the zip file
 * @param keep - which parts to return, by name (others are inflated, counted and dropped)
 * @param limits - the caps (defaults: {@link importLimits})
 * @returns the true total unzipped size, bytes, and the kept parts by name
 * @throws {ImportError} "uncompressed-too-large" naming the limit; "corrupt" for a damaged zip
 * @example
 * unzipChecked('trial.xlsx', bytes, (n) => n === 'xl/workbook.xml').parts.get('xl/workbook.xml')
 */
export function unzipChecked(
  name: string,
  bytes: Uint8Array,
  keep: (part: string) => boolean,
  limits: Pick<
    ImportLimits,
    'maxUncompressedBytes' | 'maxZipEntries' | 'maxCompressionRatio'
  > = importLimits,
): { total: number; parts: Map<string, Uint8Array> } {
  const cap = limits.maxUncompressedBytes;
  const tooLarge = (what: string) =>
    new ImportError(
      'uncompressed-too-large',
      `"${name}" ${what}, more than the limit of ${formatBytes(cap)} for a workbook's unzipped contents; a trial workbook is a few MB. If the file is genuine, save a copy with only the trial sheets.`,
      { file: name },
    );
  const entries = readEntries(name, bytes, limits.maxZipEntries);
  const declared = entries.reduce((s, e) => s + e.declaredSize, 0);
  if (declared > cap) throw tooLarge(`declares ${formatBytes(declared)} of contents`);

  const parts = new Map<string, Uint8Array>();
  const damaged = (e: ZipEntry) =>
    corrupt(name, `the part "${e.name}" does not match its checksum`);
  let total = 0;
  for (const e of entries) {
    const lh = e.localOffset;
    if (lh + 30 > bytes.length || u32(bytes, lh) !== 0x04034b50) {
      throw corrupt(name, `the part "${e.name}" is missing`);
    }
    const start = lh + 30 + u16(bytes, lh + 26) + u16(bytes, lh + 28);
    const end = start + e.compressedSize;
    if (end > bytes.length) throw corrupt(name, `the part "${e.name}" is cut short`);
    const kept = keep(e.name);
    if (e.method === 0) {
      total += e.compressedSize;
      if (total > cap) throw tooLarge(`unzips to more than ${formatBytes(total)}`);
      const stored = bytes.subarray(start, end);
      if (~crcUpdate(0xffffffff, stored) >>> 0 !== e.crc32) throw damaged(e);
      if (kept) parts.set(e.name, stored);
      continue;
    }
    if (e.method !== 8)
      throw corrupt(name, `the part "${e.name}" uses an unknown compression method ${e.method}`);
    let partOut = 0;
    let partIn = 0;
    let crc = 0xffffffff;
    const chunks: Uint8Array[] = [];
    const ratioCap = limits.maxCompressionRatio;
    const inflater = new Inflate((chunk) => {
      total += chunk.length;
      partOut += chunk.length;
      if (total > cap) throw new CapReached('total');
      if (partOut > 8 * 1024 * 1024 && partOut / partIn > ratioCap) throw new CapReached('ratio');
      crc = crcUpdate(crc, chunk);
      if (kept) chunks.push(chunk);
    });
    // Small input chunks bound each push's output (deflate expands at most ~1032:1).
    const step = 4096;
    try {
      for (let i = start; i < end; i += step) {
        const piece = bytes.subarray(i, Math.min(end, i + step));
        partIn += piece.length;
        inflater.push(piece, i + step >= end);
      }
    } catch (err) {
      if (err instanceof CapReached && err.message === 'ratio') {
        throw new ImportError(
          'uncompressed-too-large',
          `"${name}" has a part ("${e.name}") that expands more than ${ratioCap}-fold when unzipped, the limit for a workbook part; real sheets expand 5–50-fold, so this file is built to exhaust memory (a "zip bomb"). It was not opened.`,
          { file: name },
        );
      }
      if (err instanceof CapReached) {
        throw tooLarge('unzips to more than that (its declared sizes are false)');
      }
      throw corrupt(name, `the part "${e.name}" does not unzip`);
    }
    if (~crc >>> 0 !== e.crc32) throw damaged(e);
    if (kept) parts.set(e.name, joined(chunks, partOut));
  }
  return { total, parts };
}

/**
 * Checks that an .xlsx zip unzips to no more than the limit and is undamaged, keeping nothing.
 * @param name - file name, for messages
 * @param bytes - the zip file
 * @param limits - the caps (defaults: {@link importLimits})
 * @returns the true total unzipped size, bytes
 * @throws {ImportError} "uncompressed-too-large" naming the limit; "corrupt" for a damaged zip
 * @example
 * guardZip('trial.xlsx', bytes) // 1843201
 */
export function guardZip(
  name: string,
  bytes: Uint8Array,
  limits: Pick<
    ImportLimits,
    'maxUncompressedBytes' | 'maxZipEntries' | 'maxCompressionRatio'
  > = importLimits,
): number {
  return unzipChecked(name, bytes, () => false, limits).total;
}
