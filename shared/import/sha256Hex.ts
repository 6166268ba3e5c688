/**
 * SHA-256 of a file's bytes for provenance, through Web Crypto (present in
 * browsers, Electron and Node 20 as globalThis.crypto).
 */

/**
 * Hashes bytes with SHA-256.
 * @param bytes - the data
 * @returns the digest as 64 lower-case hex digits
 * @example
 * await sha256Hex(new Uint8Array()) // 'e3b0c442…b855'
 */
export async function sha256Hex(bytes: Uint8Array): Promise<string> {
  const copy = new Uint8Array(bytes.byteLength);
  copy.set(bytes);
  const digest = await globalThis.crypto.subtle.digest('SHA-256', copy);
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, '0')).join('');
}
