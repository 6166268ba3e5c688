/**
 * Moisture adjustment of a grain weight: the dry matter stays the same, so
 * adjusted = wet × (100 − M_wet) / (100 − M_standard), moistures in % wet
 * basis. This is the shrink formula grain buyers use without the handling
 * allowance (common practice).
 */

/**
 * Adjusts a yield weighed at harvest moisture to a standard moisture.
 * @param wetYield - yield at harvest moisture, any weight-per-area unit
 * @param harvestMoisturePct - grain moisture at harvest, % wet basis (0 ≤ M < 100)
 * @param standardMoisturePct - moisture to express the yield at, % wet basis (0 ≤ M < 100)
 * @returns the yield at standard moisture, same unit as `wetYield`
 * @throws {RangeError} when a moisture is outside [0, 100)
 * @example
 * adjustMoisture(200, 20, 15.5) // ≈ 189.35
 */
export function adjustMoisture(
  wetYield: number,
  harvestMoisturePct: number,
  standardMoisturePct: number,
): number {
  // Checked one by one rather than through a list: import adjusts every plot of a sheet.
  checkMoisture('harvest moisture', harvestMoisturePct);
  checkMoisture('standard moisture', standardMoisturePct);
  return (wetYield * (100 - harvestMoisturePct)) / (100 - standardMoisturePct);
}

function checkMoisture(name: string, m: number): void {
  if (!(m >= 0 && m < 100)) {
    throw new RangeError(`The ${name} must be at least 0 % and below 100 %; got ${m} %.`);
  }
}
