// Deep freeze for the inputs a scan hands to rules: a rule that tries to mutate the design throws
// (strict-mode TypeError) instead of corrupting what later rules and the rewriter see.
function frozenMapError(): never {
  throw new TypeError('the design given to rules is read-only');
}

export function deepFreeze<T>(value: T, seen = new WeakSet<object>()): T {
  if (value === null || typeof value !== 'object' || seen.has(value as object) || Object.isFrozen(value)) return value;
  seen.add(value as object);
  if (value instanceof Map) {
    for (const [k, v] of value) {
      deepFreeze(k, seen);
      deepFreeze(v, seen);
    }
    // Object.freeze does not stop Map methods; shadow them on the instance.
    Object.defineProperties(value, {
      set: { value: frozenMapError },
      delete: { value: frozenMapError },
      clear: { value: frozenMapError },
    });
  } else if (value instanceof Set) {
    for (const v of value) deepFreeze(v, seen);
    Object.defineProperties(value, { add: { value: frozenMapError }, delete: { value: frozenMapError }, clear: { value: frozenMapError } });
  } else if (ArrayBuffer.isView(value)) {
    return value; // typed arrays cannot be frozen; the engine never hands them to rules mutable
  } else {
    for (const key of Object.keys(value as object)) deepFreeze((value as Record<string, unknown>)[key], seen);
  }
  return Object.freeze(value);
}
