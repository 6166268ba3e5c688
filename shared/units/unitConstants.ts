/**
 * Exact definitions every conversion in Plotrate is built from.
 *
 * The pound and the foot are the international ones (exact, by the 1959
 * agreement; NIST SP 811, 2008, appendix B; NIST Handbook 44, appendix C).
 * The acre is the international acre, 43 560 ft² of the international foot:
 * 43 560 × 0.3048² m² = 4046.856 422 4 m² exactly. The US survey acre
 * (4046.872 609 874 m², from the survey foot 1200/3937 m) differs by 2 parts
 * per million, far below any plot-trial precision, and the survey foot was
 * retired by NIST at the end of 2022, so the international acre is used.
 */

/** Kilograms in one pound (avoirdupois), exact. */
export const KG_PER_LB = 0.45359237;

/** Metres in one foot (international), exact. */
export const M_PER_FT = 0.3048;

/** Square metres in one acre (international), exact: 43 560 ft². */
export const M2_PER_ACRE = 43560 * M_PER_FT * M_PER_FT;

/** Square metres in one hectare, exact. */
export const M2_PER_HA = 10000;

/**
 * Factor from lb/ac to kg/ha: KG_PER_LB × M2_PER_HA / M2_PER_ACRE ≈ 1.120851.
 * @example
 * 100 * LB_AC_TO_KG_HA // ≈ 112.0851 kg/ha
 */
export const LB_AC_TO_KG_HA = (KG_PER_LB * M2_PER_HA) / M2_PER_ACRE;

/** Grams in one kilogram and kilograms in one tonne (megagram). */
export const G_PER_KG = 1000;
export const KG_PER_T = 1000;
