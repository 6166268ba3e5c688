/**
 * Bytes of a text file to a string: UTF-8 with or without BOM, UTF-16 with a
 * BOM, and Windows-1252 for files saved by older spreadsheet programs
 * (detected when the bytes are not valid UTF-8).
 */

/**
 * Decodes a text file.
 * @param bytes - the file's bytes
 * @returns the text without a BOM, and the encoding used
 * @example
 * decodeText(new Uint8Array([0xef, 0xbb, 0xbf, 0x41])).text // 'A'
 */
export function decodeText(bytes: Uint8Array): { text: string; encoding: string } {
  if (bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) {
    return { text: new TextDecoder('utf-8').decode(bytes.subarray(3)), encoding: 'utf-8' };
  }
  if (bytes[0] === 0xff && bytes[1] === 0xfe) {
    return { text: new TextDecoder('utf-16le').decode(bytes.subarray(2)), encoding: 'utf-16le' };
  }
  if (bytes[0] === 0xfe && bytes[1] === 0xff) {
    return { text: new TextDecoder('utf-16be').decode(bytes.subarray(2)), encoding: 'utf-16be' };
  }
  try {
    return { text: new TextDecoder('utf-8', { fatal: true }).decode(bytes), encoding: 'utf-8' };
  } catch {
    return { text: new TextDecoder('windows-1252').decode(bytes), encoding: 'windows-1252' };
  }
}
