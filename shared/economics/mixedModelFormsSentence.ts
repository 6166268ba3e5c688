/**
 * The sentence that says which regional mixed model form the AIC favours: the quadratic, the
 * quadratic-plateau or the linear-plateau, all fitted by ML to the same site-years, so their
 * AICs compare (Burnham & Anderson, Model Selection and Multimodel Inference, 2nd ed., 2002,
 * §2.6: a difference under 2 is little evidence either way). A form whose fit did not converge
 * is named but not ranked: its likelihood is not a maximum; one that cycles within 0.1 % (a
 * linear-plateau with joins on tested rates) is ranked, with a word on it.
 */
import { modelLabelInText } from '../models/curves';

/** One fitted form as the sentence reads it. */
export interface MixedModelFormAic {
  model: 'quadratic' | 'quadraticPlateau' | 'linearPlateau';
  /** AIC of the ML fit, in any one yield unit shared by all forms; null when not fitted. */
  aic: number | null;
  converged: boolean;
  /** Converged, or cycling with its fixed effects within 0.1 %: ranked, with a word. */
  settled: boolean;
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
  const ranked = forms
    .filter((f): f is MixedModelFormAic & { aic: number } => f.aic !== null && f.settled)
    .sort((a, b) => a.aic - b.aic);
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
