// Display settings: the US/metric switch and the locale numbers and dates follow.
import { displayUnits, type DisplayUnits, type UnitSystem } from '../lib/format';

export class Settings {
  unitSystem = $state<UnitSystem>('metric');
  /** BCP 47 locale for Intl; the browser's own unless the user picks one. */
  locale = $state<string>(typeof navigator === 'undefined' ? 'en-US' : navigator.language);
  units: DisplayUnits = $derived(displayUnits(this.unitSystem));
}
