// Safe lookups in name-keyed records: names come from user files, and a net or cell called
// "constructor" or "__proto__" must never reach Object.prototype.

/** The record's own entry for `key`, never an inherited one. */
export function own<T>(rec: Readonly<Record<string, T>> | undefined, key: string): T | undefined {
  return rec !== undefined && Object.hasOwn(rec, key) ? rec[key] : undefined;
}

/** An empty record without a prototype, so assigning any name (even "__proto__") stores it. */
export function dict<T>(): Record<string, T> {
  return Object.create(null) as Record<string, T>;
}
