import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  KG_PER_LB,
  M2_PER_ACRE,
  LB_AC_TO_KG_HA,
  convertRate,
  formatNutrientRate,
  rateFromKgHa,
  convertYield,
  yieldFromKgHa,
  plotWeightToKgHa,
  areaToM2,
  lengthToM,
  adjustMoisture,
  crops,
  cropIds,
  isCropId,
  products,
  productFromText,
  formatQuantity,
  showRate,
  showYield,
  displayUnits,
  type RateUnit,
  type YieldUnit,
} from '../shared/units';
import { formatShownRate } from '../shared/units/rateRounding';

describe('unit constants', () => {
  it('the pound is exactly 0.453 592 37 kg', () => {
    // NIST SP 811 (2008) appendix B.8 and NIST Handbook 44 appendix C: 1 lb (avdp) = 0.453 592 37 kg exactly.
    expect(KG_PER_LB).toBe(0.45359237);
  });
  it('the international acre is 4046.856 422 4 m² and within 5 ppm of the survey acre', () => {
    // NIST Handbook 44 appendix C: 1 acre = 43 560 ft²; international foot = 0.3048 m exactly (NIST SP 811 B.8).
    expect(M2_PER_ACRE).toBeCloseTo(4046.8564224, 9);
    // Survey acre: 43 560 × (1200/3937)² m² (NIST Handbook 44 appendix C, survey foot).
    const surveyAcre = 43560 * (1200 / 3937) ** 2;
    expect(Math.abs(surveyAcre - M2_PER_ACRE) / M2_PER_ACRE).toBeLessThan(5e-6);
    expect(Math.abs(surveyAcre - M2_PER_ACRE) / M2_PER_ACRE).toBeGreaterThan(1e-6);
  });
  it('1 lb/ac is 1.120 851 kg/ha', () => {
    // Derived by hand from the two exact definitions: 0.45359237 kg / 0.40468564224 ha.
    // The rounded factor 1.12085 appears in extension conversion tables (from memory).
    expect(LB_AC_TO_KG_HA).toBeCloseTo(1.12085116, 8);
  });
});

describe('convertRate', () => {
  it('converts lb/ac, g/m² and kg/ha to kg/ha', () => {
    expect(convertRate(160, 'lb/ac')).toBeCloseTo(179.336, 3); // 160 × 1.120851
    expect(convertRate(12, 'g/m2')).toBeCloseTo(120, 12); // 1 g/m² = 10 kg/ha by definition of the hectare
    expect(convertRate(90, 'kg/ha')).toBe(90);
  });
  it('rateFromKgHa undoes convertRate for every unit', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1e5, noNaN: true }),
        fc.constantFrom<RateUnit>('kg/ha', 'lb/ac', 'g/m2'),
        (v, u) => Math.abs(rateFromKgHa(convertRate(v, u), u) - v) <= 1e-12 * Math.max(1, v),
      ),
    );
  });
  it('writes a nutrient rate with the nutrient in its unit, g/m² included', () => {
    // Common practice: a fertilizer rate names its nutrient ("150 lb N/ac"); SI writes m² with a superscript (NIST SP 811).
    expect(formatNutrientRate(150, 'lb/ac')).toBe('150 lb N/ac');
    expect(formatNutrientRate(1234.4, 'kg/ha')).toBe('1,234 kg N/ha');
    expect(formatNutrientRate(12.46, 'g/m2')).toBe('12.5 g N/m²');
    expect(formatNutrientRate(null, 'g/m2')).toBe('—');
    // A reported rate: whole kg/ha and lb/ac, tenths of g/m² (shared/units/rateRounding).
    expect(formatShownRate(157.4, 'kg/ha')).toBe('157 kg N/ha');
    expect(formatShownRate(15.74, 'g/m2')).toBe('15.7 g N/m²');
  });
  it('refuses an unknown unit with a message naming it', () => {
    expect(() => convertRate(1, 'oz/ac' as RateUnit)).toThrow(/Unknown rate unit "oz\/ac"/);
  });
});

describe('convertYield', () => {
  it('turns bushels into kilograms with the USDA bushel weights', () => {
    // USDA Agricultural Handbook 697: corn 56 lb/bu, wheat and soybean 60 lb/bu, barley 48, oats 32 (from memory).
    expect(crops('corn').bushelLb).toBe(56);
    expect(crops('wheat').bushelLb).toBe(60);
    expect(crops('soybean').bushelLb).toBe(60);
    expect(crops('barley').bushelLb).toBe(48);
    expect(crops('oats').bushelLb).toBe(32);
    // Extension tables give 1 bu/ac corn = 62.77 kg/ha and 1 bu/ac wheat = 67.25 kg/ha (from memory).
    expect(convertYield(1, 'bu/ac', 'corn')).toBeCloseTo(62.77, 2);
    expect(convertYield(1, 'bu/ac', 'wheat')).toBeCloseTo(67.25, 2);
    // Independent hand computation: 200 bu × 56 lb × 0.45359237 kg / 0.40468564224 ha.
    expect(convertYield(200, 'bu/ac', 'corn')).toBeCloseTo(
      (200 * 56 * 0.45359237) / 0.40468564224,
      6,
    );
  });
  it('converts t/ha, lb/ac and g/m² to kg/ha', () => {
    expect(convertYield(9.35, 't/ha', 'wheat')).toBeCloseTo(9350, 9);
    expect(convertYield(1000, 'lb/ac', 'wheat')).toBeCloseTo(1120.851, 3);
    expect(convertYield(850, 'g/m2', 'wheat')).toBeCloseTo(8500, 9);
  });
  it('yieldFromKgHa undoes convertYield for every unit and crop', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1e5, noNaN: true }),
        fc.constantFrom<YieldUnit>('kg/ha', 't/ha', 'lb/ac', 'bu/ac', 'g/m2'),
        fc.constantFrom(...cropIds),
        (v, u, c) =>
          Math.abs(yieldFromKgHa(convertYield(v, u, c), u, c) - v) <= 1e-12 * Math.max(1, v),
      ),
    );
  });
});

describe('plot weights and sizes', () => {
  it('plotWeightToKgHa divides weight by area', () => {
    expect(plotWeightToKgHa(9.6, 'kg', 12, 'm2')).toBeCloseTo(8000, 9);
    expect(plotWeightToKgHa(9600, 'g', 12, 'm2')).toBeCloseTo(8000, 9);
    // 50 lb off 1/100 acre = 5000 lb/ac = 5604.26 kg/ha (exact pound and acre).
    expect(plotWeightToKgHa(50, 'lb', 0.01, 'ac')).toBeCloseTo(5000 * 1.1208511, 2);
    expect(plotWeightToKgHa(50, 'lb', 435.6, 'ft2')).toBeCloseTo(5000 * 1.1208511, 2);
  });
  it('refuses a zero area', () => {
    expect(() => plotWeightToKgHa(1, 'kg', 0, 'm2')).toThrow(/plot area must be positive/);
  });
  it('areaToM2 and lengthToM use the exact foot and acre', () => {
    expect(areaToM2(1, 'ha')).toBe(10000);
    expect(areaToM2(1, 'ft2')).toBeCloseTo(0.09290304, 12); // NIST SP 811 B.8: ft² = 9.290 304 E-02 m² exactly
    expect(lengthToM(10, 'ft')).toBeCloseTo(3.048, 12);
  });
});

describe('adjustMoisture', () => {
  it('keeps dry matter constant', () => {
    // Hand computation: 200 × (100 − 20)/(100 − 15.5) = 16000/84.5.
    expect(adjustMoisture(200, 20, 15.5)).toBeCloseTo(189.3491, 4);
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 20000, noNaN: true }),
        fc.double({ min: 5, max: 40, noNaN: true }),
        fc.double({ min: 8, max: 16, noNaN: true }),
        (wet, m, s) => {
          const adj = adjustMoisture(wet, m, s);
          const dryWet = wet * (1 - m / 100);
          const dryAdj = adj * (1 - s / 100);
          return Math.abs(dryWet - dryAdj) <= 1e-9 * wet;
        },
      ),
    );
  });
  it('refuses a moisture of 100 % or more with a message naming it', () => {
    expect(() => adjustMoisture(1, 100, 15.5)).toThrow(
      /harvest moisture must be at least 0 % and below 100 %; got 100 %/,
    );
  });
});

describe('crops and products', () => {
  it('standard moistures are the usual market bases', () => {
    // Common practice: corn 15.5 %, soybean 13 %, wheat 13.5 % (varies by market).
    expect(crops('corn').standardMoisturePct).toBe(15.5);
    expect(crops('soybean').standardMoisturePct).toBe(13);
    expect(crops('wheat').standardMoisturePct).toBe(13.5);
    expect(isCropId('corn')).toBe(true);
    expect(isCropId('maize')).toBe(false);
    expect(() => crops('rye' as never)).toThrow(/Unknown crop "rye"/);
  });
  it('nitrogen analyses are the trade grades', () => {
    // Common practice: urea 46-0-0, UAN 28 and 32 %, anhydrous ammonia 82-0-0, AMS 21-0-0, AN 34-0-0.
    expect(products('urea').nitrogenPct).toBe(46);
    expect(products('uan28').nitrogenPct).toBe(28);
    expect(products('uan32').nitrogenPct).toBe(32);
    expect(products('anhydrous').nitrogenPct).toBe(82);
    expect(products('ammoniumSulfate').nitrogenPct).toBe(21);
    expect(products('ammoniumNitrate').nitrogenPct).toBe(34);
  });
  it('productFromText reads product names as sheets write them', () => {
    expect(productFromText('Urea')?.id).toBe('urea');
    expect(productFromText('UAN-32')?.id).toBe('uan32');
    expect(productFromText('uan 28%')?.id).toBe('uan28');
    expect(productFromText('NH3 knifed')?.id).toBe('anhydrous');
    expect(productFromText('AMS')?.id).toBe('ammoniumSulfate');
    expect(productFromText('plant count')).toBeNull();
  });
});

describe('formatQuantity', () => {
  it('uses the usual precision of each unit', () => {
    expect(formatQuantity(187.36, 'bu/ac')).toBe('187.4 bu/ac');
    expect(formatQuantity(12553.4, 'kg/ha')).toBe('12,553 kg/ha');
    expect(formatQuantity(9.3549, 't/ha')).toBe('9.35 t/ha');
    expect(formatQuantity(17.25, '%')).toBe('17.3 %');
    expect(formatQuantity(-0.01, 'kg/ha')).toBe('0 kg/ha');
    expect(formatQuantity(null, 'kg/ha')).toBe('—');
    expect(formatQuantity(179.34, 'lb N/ac')).toBe('179 lb N/ac');
    expect(formatQuantity(0.012345, 'mg')).toBe('0.012 mg');
  });
  it('shows canonical values in the chosen system', () => {
    expect(displayUnits('metric')).toEqual({ rate: 'kg/ha', yield: 't/ha' });
    expect(showRate(convertRate(160, 'lb/ac'), 'us')).toBe('160 lb/ac');
    expect(showYield(convertYield(200, 'bu/ac', 'corn'), 'corn', 'us')).toBe('200.0 bu/ac');
    expect(showYield(9350, 'wheat', 'metric')).toBe('9.35 t/ha');
  });
});
