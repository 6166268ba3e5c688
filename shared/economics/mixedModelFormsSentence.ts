/**
 * The sentence that says which regional mixed model form the AIC favours: the quadratic, the
 * quadratic-plateau or the linear-plateau, all fitted by ML to the same site-years, so their
 * AICs compare (Burnham & Anderson, Model Selection and Multimodel Inference, 2nd ed., 2002,
 * §2.6: a difference under 2 is little evidence either way). A form whose fit did not converge
 * is named but not ranked: its likelihood is not a maximum; one that cycles within 0.1 % (a
 * linear-plateau with joins on tested rates) is ranked, with a word on it.
 */
import { modelLabelInText } from '../models/curves';
import type { MixedModelOptimum } from './mixedModelOptimum';
import type { MixedModelSentenceFormat } from './mixedModelSentence';

/** One fitted form as the sentence reads it. */
export interface MixedModelFormAic {
  model: 'quadratic' | 'quadraticPlateau' | 'linearPlateau';
  /** AIC of the ML fit, in any one yield unit shared by all forms; null when not fitted. */
  aic: number | null;
  converged: boolean;
  /** Converged, or cycling with its fixed effects within 0.1 %: ranked, with a word. */
  settled: boolean;
  /** The form's regional optimum at the current prices, where the caller has priced it. */
  optimum?: MixedModelOptimum | null;
}

/** The forms the AIC ranks (fitted and settled), lowest AIC first. */
function rankedForms(forms: readonly MixedModelFormAic[]): (MixedModelFormAic & { aic: number })[] {
  return forms
    .filter((f): f is MixedModelFormAic & { aic: number } => f.aic !== null && f.settled)
    .sort((a, b) => a.aic - b.aic);
}

/** AIC differences below this are "about as well supported" (Burnham & Anderson, §2.6). */
const CLOSE = 2;

/**
 * Which form the AIC favours, in one or two sentences.
 * @param forms - every form tried, fitted or not
 * @returns e.g. "Of the regional mixed models, the AIC favours the quadratic-plateau (AIC 2351.9); the quadratic is 12.1 higher."; '' with fewer than two converged fits
 * @example
 * mixedModelFormsSentence([{ model: 'quadratic', aic: 2363.9, converged: true, settled: true }, { model: 'quadraticPlateau', aic: 2351.9, converged: true, settled: true }])
 */
export function mixedModelFormsSentence(forms: readonly MixedModelFormAic[]): string {
  const ranked = rankedForms(forms);
  const unsettled = forms.filter((f) => f.aic !== null && !f.settled);
  const cycling = ranked.filter((f) => !f.converged);
  if (ranked.length < 2) return '';
  const [best, ...rest] = ranked;
  const others = rest.map(
    (f) => `the ${modelLabelInText(f.model)} ${(f.aic - best.aic).toFixed(1)} higher`,
  );
  const close = rest.filter((f) => f.aic - best.aic < CLOSE);
  const parts = [
    `Of the regional mixed models, the AIC favours the ${modelLabelInText(best.model)} (${others.join(', ')}).`,
  ];
  if (close.length > 0) {
    parts.push(
      `A difference under ${CLOSE} is little evidence either way: the ${close.map((f) => modelLabelInText(f.model)).join(' and the ')} ${close.length > 1 ? 'fit' : 'fits'} about as well.`,
    );
  }
  if (cycling.length > 0) {
    parts.push(
      `The ${cycling.map((f) => modelLabelInText(f.model)).join(' and the ')} fit cycles between nearby solutions, so ${cycling.length > 1 ? 'their AICs are' : 'its AIC is'} good to a few tenths.`,
    );
  }
  if (unsettled.length > 0) {
    parts.push(
      `The ${unsettled.map((f) => modelLabelInText(f.model)).join(' and the ')} did not settle on one fit, so ${unsettled.length > 1 ? 'they are' : 'it is'} not ranked.`,
    );
  }
  return parts.join(' ');
}

/**
 * Where the form the AIC favours puts the regional rate, when that form is a plateau: the
 * quadratic's rate is the regional model's own sentence (mixedModelSentence), so a reader who is
 * told a plateau form fits better also reads what it recommends.
 * @param forms - every form tried, each with its optimum at the current prices
 * @param format - how to write rates (the caller's units)
 * @returns e.g. "On the quadratic-plateau the most profitable regional rate is 168 kg/ha (90 %
 *   interval 141 to 195 kg/ha)."; '' when the quadratic leads, fewer than two forms are ranked,
 *   or the favoured form has no optimum
 * @example
 * favouredFormRateSentence(forms, { rate: (r) => `${r} kg/ha`, interval: (i) => `${i.lowKgHa} to ${i.highKgHa} kg/ha` })
 */
export function favouredFormRateSentence(
  forms: readonly MixedModelFormAic[],
  format: MixedModelSentenceFormat,
): string {
  const ranked = rankedForms(forms);
  const best = ranked[0];
  if (ranked.length < 2 || best.model === 'quadratic' || !best.optimum) return '';
  const o = best.optimum;
  const label = modelLabelInText(best.model);
  if (o.status === 'no-maximum' || o.interval === null)
    return `On the ${label}, ${format.rate(o.rateKgHa)} pays best of the tested range.`;
  return `On the ${label} the most profitable regional rate is ${format.rate(o.rateKgHa)} (${Math.round(o.level * 100)} % interval ${format.interval(o.interval)}).`;
}
