/**
 * Fields built on first read: an object keeps its plain-data shape (an enumerable property that
 * JSON, spread, structured clone and equality read like any other) while the work behind it is
 * done only if someone reads it.
 */

/**
 * Defines `key` on `target` as an enumerable property whose value is built by `build` on the
 * first read and kept (a write replaces it). The value lives in the closure, so a frozen target
 * still reads it.
 */
export function defineLazy<T extends object, K extends keyof T>(target: T, key: K, build: () => T[K]): void {
  let value: T[K] | undefined;
  let built = false;
  Object.defineProperty(target, key, {
    enumerable: true,
    configurable: true,
    get(): T[K] {
      if (!built) {
        value = build();
        built = true;
      }
      return value as T[K];
    },
    set(v: T[K]) {
      value = v;
      built = true;
    },
  });
}
