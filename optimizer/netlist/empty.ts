// Emptying a scratch list that is about to be filled again. `list.length = 0` makes the engine
// (V8) let go of the list's storage, so the next push allocates fresh storage: in a loop run once
// per card or per device that was most of the garbage a million-device deck made. Popping keeps
// the storage (the engine shrinks it only once it is mostly unused), so the list is truly reused.

/** Empties the list in place, keeping its storage for the entries to come. */
export function empty(list: unknown[]): void {
  for (let n = list.length; n > 0; n--) list.pop();
}
