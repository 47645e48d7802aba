// empty() leaves the same list with no entries, ready to be filled again.
import { describe, expect, it } from 'vitest';
import { empty } from './empty';

describe('empty', () => {
  it('empties a list in place, short or long, and it fills again as new', () => {
    for (const n of [0, 1, 3, 17, 1000]) {
      const list = Array.from({ length: n }, (_, i) => i);
      const same = list;
      empty(list);
      expect(list).toBe(same);
      expect(list).toEqual([]);
      list.push(7, 8);
      expect(list).toEqual([7, 8]);
    }
  });
});
