/**
 * A field of a plain result object computed when first read, then kept. For the priced view's
 * costly parts that most views never read (shared/analysis/priceSite), so a price slider over
 * many sites pays only for what is on screen, while the command line's JSON, the workbook and
 * the report, which read every field, pay as before.
 */

/**
 * Makes `key` of `target` a value computed when first read, then kept. Enumerable, so JSON,
 * spreads and structured clones read it like any field (and compute it then).
 * @param target - the object, whose `key` holds a placeholder until now
 * @param key - the field
 * @param compute - makes the value, called at most once
 * @example
 * keptOnFirstRead(priced, 'interval', () => optimumInterval(draws, model, prices, 0.9));
 */
export function keptOnFirstRead<T extends object, K extends keyof T>(
  target: T,
  key: K,
  compute: () => T[K],
): void {
  let value: T[K] | undefined;
  let read = false;
  Object.defineProperty(target, key, {
    enumerable: true,
    configurable: true,
    get(): T[K] {
      if (!read) {
        value = compute();
        read = true;
      }
      return value as T[K];
    },
  });
}
