/**
 * The regional mixed model forms of an across-site analysis as the AIC sentence reads them
 * (mixedModelFormsSentence): the quadratic's ML AIC and each plateau form's, with whether each
 * converged. For views that hold the analysis rather than the report (the screen).
 */
import type { MixedModelFormAic } from '../economics/mixedModelFormsSentence';
import type { MixedModelOptimum } from '../economics/mixedModelOptimum';
import type { AcrossSiteAnalysis } from './acrossSites';

/**
 * Every form tried, fitted or not.
 * @param across - the across-site analysis (its `mixed` and `plateauMixed`)
 * @param optima - the priced optima, when the sentence should say what the favoured form
 *   recommends: the quadratic's (PricedTrial.mixedOptimum) and the plateau forms' in
 *   `plateauMixed` order (PricedTrial.plateauMixedOptima)
 * @returns one entry per form: quadratic first, then PLATEAU_MIXED_FORMS
 * @example
 * mixedModelFormsSentence(mixedModelFormAics(priced.across))
 */
export function mixedModelFormAics(
  across: Pick<AcrossSiteAnalysis, 'mixed' | 'plateauMixed'>,
  optima?: { quadratic: MixedModelOptimum | null; plateau: readonly (MixedModelOptimum | null)[] },
): MixedModelFormAic[] {
  const q = across.mixed;
  return [
    {
      model: 'quadratic',
      aic: q.model === null ? null : q.aic,
      converged: q.model !== null && q.converged,
      settled: q.model !== null && q.converged,
      optimum: optima?.quadratic ?? null,
    },
    ...across.plateauMixed.map((m, i) =>
      m.model === null
        ? { model: m.form, aic: null, converged: false, settled: false }
        : {
            model: m.model,
            aic: m.aic,
            converged: m.converged,
            settled: m.settled,
            optimum: optima?.plateau[i] ?? null,
          },
    ),
  ];
}
