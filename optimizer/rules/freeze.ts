// Deep freeze for the inputs a scan hands to rules: a rule that tries to mutate the design throws
// (strict-mode TypeError) instead of corrupting what later rules and the rewriter see.
function frozenMapError(): never {
  throw new TypeError('the design given to rules is read-only');
}

const LOCKED_MAP = { set: { value: frozenMapError }, delete: { value: frozenMapError }, clear: { value: frozenMapError } };
const LOCKED_SET = { add: { value: frozenMapError }, delete: { value: frozenMapError }, clear: { value: frozenMapError } };

/**
 * Freezes each object before its contents (pre-order), so an object met again — shared logic in a
 * view is a DAG, and a cycle would loop — is already frozen and skipped: no visited set to keep,
 * which on a large design is millions of entries the collector must trace. A value that was
 * frozen before the call is taken as already deep-frozen.
 */
export function deepFreeze<T>(value: T): T {
  if (value === null || typeof value !== 'object' || Object.isFrozen(value)) return value;
  // The pushes are written out (no helper closure): this loop visits every object of a design.
  const stack: object[] = [value as object];
  while (stack.length) {
    const o = stack.pop()!;
    if (Object.isFrozen(o)) continue;
    if (ArrayBuffer.isView(o)) continue; // typed arrays cannot be frozen; the engine never hands them to rules mutable
    if (Array.isArray(o)) {
      Object.freeze(o);
      for (let i = 0; i < o.length; i++) {
        const x: unknown = o[i];
        if (x !== null && typeof x === 'object' && !Object.isFrozen(x)) stack.push(x);
      }
    } else if (o instanceof Map) {
      // Object.freeze does not stop Map methods; shadow them on the instance.
      Object.defineProperties(o, LOCKED_MAP);
      Object.freeze(o);
      // forEach, not for…of: no entry pair allocated per entry (a name index has millions)
      (o as Map<unknown, unknown>).forEach((v, k) => {
        if (k !== null && typeof k === 'object' && !Object.isFrozen(k)) stack.push(k);
        if (v !== null && typeof v === 'object' && !Object.isFrozen(v)) stack.push(v);
      });
    } else if (o instanceof Set) {
      Object.defineProperties(o, LOCKED_SET);
      Object.freeze(o);
      (o as Set<unknown>).forEach((v) => {
        if (v !== null && typeof v === 'object' && !Object.isFrozen(v)) stack.push(v);
      });
    } else {
      Object.freeze(o);
      const rec = o as Record<string, unknown>;
      for (const key in rec) {
        if (!Object.prototype.hasOwnProperty.call(rec, key)) continue;
        const x = rec[key];
        if (x !== null && typeof x === 'object' && !Object.isFrozen(x)) stack.push(x);
      }
    }
  }
  return value;
}
