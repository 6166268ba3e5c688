/**
 * The cautions that go with every rate recommendation Plotrate produces. An
 * economic optimum is only as good as the trials and prices behind it, and
 * nitrogen beyond what the crop takes up costs money and can leave the field
 * (common practice in extension advice; no single document).
 */

/** Sentences to show or print with any recommended rate, in this order. */
export const recommendationCautions: readonly string[] = [
  'This rate comes from these trials and these prices only.',
  'Soil, weather and management differ between fields and years; the best rate next season can differ.',
  'Nitrogen beyond what the crop uses costs money and can reach ground and surface water.',
  'Follow local regulations and any nutrient-management plan that applies to the field.',
  'Defer to a licensed or certified agronomist for the rate you apply.',
];
