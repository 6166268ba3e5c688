// Shared by the tests/stats.*.test.ts files: readers for the NIST StRD and R
// fixtures and tolerance checks that say what they compare.
import { readFileSync } from 'node:fs';
import { expect } from 'vitest';

/** Reads a fixture file next to the tests. */
export function readFixture(path: string): string {
  return readFileSync(new URL(`./fixtures/${path}`, import.meta.url), 'utf8');
}

/**
 * The observations of a NIST StRD file: every two-number line after the last
 * line starting "Data" (the .dat files have a "Data:" line in their header too).
 * Returns the two columns in file order.
 */
export function readNistPairs(file: string): { first: number[]; second: number[] } {
  const lines = readFixture(`nist/${file}`).split(/\r?\n/);
  const start = lines.findLastIndex((l) => /^Data/.test(l));
  const first: number[] = [];
  const second: number[] = [];
  for (const line of lines.slice(start + 1)) {
    const parts = line.trim().split(/\s+/);
    if (parts.length === 2 && parts.every((p) => Number.isFinite(Number(p)))) {
      first.push(Number(parts[0]));
      second.push(Number(parts[1]));
    }
  }
  return { first, second };
}

/** The R reference values (tests/fixtures/stats-r/stats-reference.json), typed loosely. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export const rReference: any = JSON.parse(readFixture('stats-r/stats-reference.json'));

/**
 * Agreement to `digits` significant digits: |actual − expected| ≤ 10^−digits · |expected|.
 * The failure message names the quantity, both values and the tolerance.
 */
export function expectDigits(actual: number, expected: number, digits: number, what: string): void {
  const tolerance = 10 ** -digits * Math.abs(expected);
  const diff = Math.abs(actual - expected);
  expect(
    diff,
    `${what}: got ${actual}, expected ${expected}, |difference| ${diff} > tolerance ${tolerance} (${digits} digits)`,
  ).toBeLessThanOrEqual(tolerance);
}

/** |actual − expected| ≤ tolerance, with a message naming the quantity. */
export function expectWithin(
  actual: number,
  expected: number,
  tolerance: number,
  what: string,
): void {
  const diff = Math.abs(actual - expected);
  expect(
    diff,
    `${what}: got ${actual}, expected ${expected}, |difference| ${diff} > tolerance ${tolerance}`,
  ).toBeLessThanOrEqual(tolerance);
}
