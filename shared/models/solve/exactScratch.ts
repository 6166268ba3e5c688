/**
 * Reusable Float64Arrays of an exact length for matrices that are only read
 * once, by a QR decomposition that copies them (shared/stats/qr). A site's
 * matrices have a handful of rows and columns, and an allocated typed array of
 * that size costs more than filling it; the engine runs single-threaded within
 * a worker, so one buffer per length is enough as long as a caller hands the
 * buffer on before asking for another of the same length.
 */
const byLength: Float64Array[] = [];

/** Lengths up to this are kept; longer ones are allocated each time. */
const LONGEST_KEPT = 256;

/**
 * A zeroed scratch array of exactly `length` numbers.
 * @param length - number of entries
 * @returns a buffer that the next call with the same length returns again
 * @example
 * const a = exactScratch(12); // fill, then pass to qrDecompose at once
 */
export function exactScratch(length: number): Float64Array {
  if (length > LONGEST_KEPT) return new Float64Array(length);
  let buffer = byLength[length];
  if (buffer === undefined) {
    buffer = new Float64Array(length);
    byLength[length] = buffer;
  } else {
    buffer.fill(0);
  }
  return buffer;
}
