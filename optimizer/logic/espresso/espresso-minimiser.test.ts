// Proves the Espresso bridge gives covers that equal the function on its care set, reaches the
// worked examples' minimal counts, never beats the exact minimiser, and survives a misbehaving child.
import { existsSync, readdirSync, readlinkSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { coverLiterals, coverMismatch, coverToText } from '../cubes';
import { exactMinimiser } from '../minimiser';
import { fromMinterms, type TruthTable } from '../truth-table';
import { WORKED_EXAMPLES, parityTable } from '../worked-examples';
import { createEspressoMinimiser } from './espresso-minimiser';
import { buildPla, buildPlaText, plaProblem, plaTextProblem, tablePayload, type TablePayload } from './pla';
import { EspressoPool, MinimiserError } from './pool';

const fixture = (name: string) => path.join(__dirname, 'fixtures', name);
const espresso = createEspressoMinimiser({ size: 2, timeoutMs: 10_000 });
afterAll(() => espresso.close());

describe('worked examples through Espresso and Quine–McCluskey', () => {
  for (const ex of WORKED_EXAMPLES) {
    for (const m of [espresso, exactMinimiser]) {
      it(`${m.name}: ${ex.name} reaches ${ex.terms.join(',')} terms (${ex.source})`, async () => {
        const { cover } = await m.minimiseCover(ex.table);
        const n = ex.table.inputs.length;
        cover.outputs.forEach((o, k) => {
          expect(coverMismatch(o.cover, ex.table.outputs[k], n), `${o.name} = ${coverToText(o.cover, cover.inputs)}`).toBeUndefined();
          expect(o.cover.length, o.name).toBe(ex.terms[k]);
          if (ex.literals) expect(coverLiterals(o.cover), o.name).toBe(ex.literals[k]);
        });
      });
    }
  }

  it('BCD to seven-segment totals 25 terms with Espresso', async () => {
    // Mano & Ciletti, Digital Design (from memory): 25 terms in all.
    const { cover } = await espresso.minimiseCover(WORKED_EXAMPLES[0].table);
    expect(cover.outputs.reduce((s, o) => s + o.cover.length, 0)).toBe(25);
  });
});

describe('Espresso against the exact minimiser on random functions', () => {
  it('is right on the care set and never uses fewer terms than the exact cover', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.integer({ min: 1, max: 6 }).chain((n) =>
          fc.tuple(fc.constant(n), fc.array(fc.constantFrom(0, 1, 1, 2), { minLength: 2 ** n, maxLength: 2 ** n })),
        ),
        async ([n, cells]) => {
          const on = cells.flatMap((c, m) => (c === 1 ? [m] : []));
          const dc = cells.flatMap((c, m) => (c === 2 ? [m] : []));
          const t = fromMinterms(Array.from({ length: n }, (_, i) => `i${i}`), [{ name: 'F', on, dc }]);
          const [e, q] = await Promise.all([espresso.minimiseCover(t), exactMinimiser.minimiseCover(t)]);
          expect(coverMismatch(e.cover.outputs[0].cover, t.outputs[0], n)).toBeUndefined();
          expect(coverMismatch(q.cover.outputs[0].cover, t.outputs[0], n)).toBeUndefined();
          expect(e.cover.outputs[0].cover.length).toBeGreaterThanOrEqual(q.cover.outputs[0].cover.length);
          expect(e.methods[0]).not.toBe('exact-fallback');
        },
      ),
      { numRuns: 60 },
    );
  });
});

describe('isolation of the native minimiser', () => {
  it('answers constant functions without starting a child', async () => {
    const m = createEspressoMinimiser();
    try {
      const t = fromMinterms(['a', 'b', 'c'], [
        { name: 'zero', on: [], dc: [0, 1] },
        { name: 'one', on: [0, 1, 2, 3, 4, 5, 6], dc: [7] },
      ]);
      const r = await m.minimiseCover(t);
      expect(r.methods).toEqual(['constant', 'constant']);
      expect(r.cover.outputs[0].cover).toEqual([]);
      expect(r.cover.outputs[1].cover).toEqual([{ care: 0, value: 0 }]);
      expect(m.pool.spawned).toBe(0);
    } finally {
      m.close();
    }
  });

  it('refuses to build or send a PLA without on-set rows', () => {
    expect(plaProblem(['.i 2', '.o 1', '.e'])).toMatch(/no on-set rows/);
    expect(plaProblem(['.i 2', '.o 1', '.type fd', '00 -', '.e'])).toMatch(/no on-set rows/);
    expect(plaProblem(['.i 2', '.o 1', '1x 1', '.e'])).toMatch(/not a row/);
    expect(plaProblem(['.i 2', '.o 1', '10 1'])).toMatch(/end with/);
    const t = fromMinterms(['a', 'b'], [{ name: 'F', on: [3], dc: [1] }]);
    expect(plaProblem(buildPla(t.outputs[0], 2))).toBeUndefined();
  });

  it('builds PLA text row by row from the table and refuses malformed text at the first bad row', () => {
    const t = fromMinterms(['a', 'b', 'c'], [{ name: 'F', on: [1, 6], dc: [7] }]);
    // Berkeley PLA type fd: on-set rows end in 1, don't-care rows in - (espresso(5) man page, from memory)
    expect(buildPlaText(t.outputs[0], 3)).toBe('.i 3\n.o 1\n.type fd\n001 1\n110 1\n111 -\n.e');
    expect(buildPla(t.outputs[0], 3)).toEqual(buildPlaText(t.outputs[0], 3).split('\n'));
    expect(plaTextProblem(buildPlaText(t.outputs[0], 3))).toBeUndefined();
    expect(plaTextProblem('.i 3\n.o 1\n001 1\n11 1\n.e')).toMatch(/line 4 "11 1" is not a row/);
    expect(plaTextProblem('.i 3\n.o 1\n001 1\n0011\n.e')).toMatch(/line 4/);
    expect(plaTextProblem('.i 3\n.o 1\n001 2\n.e')).toMatch(/line 3/);
    expect(plaTextProblem('.i 3\n.o 1\n001 1\n001 1')).toMatch(/end with/);
    expect(plaTextProblem('.i 17\n.o 1\n.e')).toMatch(/outside/);
    expect(plaTextProblem('.o 1\n.i 3\n.e')).toMatch(/must start/);
    expect(plaProblem(['.i 1', '.o 1', '1 1\n0 1', '.e'])).toMatch(/line break/);
  });

  it('kills a child that exceeds the timeout and serves the next request with a fresh one', async () => {
    const pool = new EspressoPool({ size: 1, workerPath: fixture('hang-worker.cjs') });
    try {
      await expect(pool.run(['.i 1', '.o 1', '1 1', '.e'], 200)).rejects.toMatchObject({ reason: 'timeout' });
      expect(pool.liveChildren).toBe(0);
      await expect(pool.run(['.i 1', '.o 1', '1 1', '.e'], 100)).rejects.toBeInstanceOf(MinimiserError);
      expect(pool.spawned).toBe(2);
    } finally {
      pool.close();
    }
  });

  it('reports a child that exits mid-request and restarts it', async () => {
    const pool = new EspressoPool({ size: 1, workerPath: fixture('exiting-worker.cjs') });
    try {
      const err = await pool.run(['.i 1', '.o 1', '1 1', '.e'], 5000).catch((e: unknown) => e);
      expect(err).toMatchObject({ reason: 'crashed' });
      expect(String((err as Error).message)).toMatch(/code 3.*cannot parse input/);
      await expect(pool.run(['.i 1', '.o 1', '1 1', '.e'], 5000)).rejects.toMatchObject({ reason: 'crashed' });
      expect(pool.spawned).toBe(2);
    } finally {
      pool.close();
    }
  });

  it('survives the real native exit on malformed input, then answers correctly', async () => {
    const m = createEspressoMinimiser({ size: 1 });
    try {
      // Sent straight to the pool, bypassing validation: the native code calls exit() on it.
      const err = await m.pool.run(['.i 2', '.o 1', '.type zz', '11 1', '.e'], 5000).catch((e: unknown) => e);
      expect(err).toMatchObject({ reason: 'crashed' });
      expect(String((err as Error).message)).toMatch(/unknown type/);
      expect(plaProblem(['.i 2', '.o 1', '.type zz', '11 1', '.e'])).toMatch(/not a row/);
      const t = fromMinterms(['a', 'b'], [{ name: 'F', on: [2, 3] }]);
      const r = await m.minimiseCover(t);
      expect(coverToText(r.cover.outputs[0].cover, ['a', 'b'])).toBe('a');
    } finally {
      m.close();
    }
  });

  it('hands Espresso its PLA through a file nothing else can see, and leaves none behind when killed', async () => {
    const leftovers = () => (existsSync('/dev/shm') ? readdirSync('/dev/shm').filter((f) => f.startsWith('trimwire-espresso-')) : []);
    const before = leftovers();
    const m = createEspressoMinimiser({ size: 1 });
    try {
      const r = await m.minimiseCover(fromMinterms(['a', 'b', 'c'], [{ name: 'F', on: [3, 5, 6, 7] }]));
      expect(coverToText(r.cover.outputs[0].cover, ['a', 'b', 'c']).split(' + ').sort()).toEqual(['ab', 'ac', 'bc']);
      // The child holds its file open but unlinked it at once, so even while it runs no name is left.
      const [pid] = m.pool.childPids;
      const held = readdirSync(`/proc/${pid}/fd`).map((fd) => {
        try {
          return readlinkSync(`/proc/${pid}/fd/${fd}`);
        } catch {
          return '';
        }
      });
      // Where there is no /dev/shm the child falls back to the package's own call (and holds none).
      expect(held.filter((link) => /^\/dev\/shm\/trimwire-espresso-.*\(deleted\)$/.test(link))).toHaveLength(existsSync('/dev/shm') ? 1 : 0);
      expect(leftovers()).toEqual(before);
    } finally {
      m.close(); // SIGKILL: the child gets no chance to tidy up
    }
    expect(leftovers()).toEqual(before);
  });

  it('does not believe a wrong cover: exact fallback for small functions, an error beyond', async () => {
    const liar = createEspressoMinimiser({ size: 1, workerPath: fixture('lying-worker.cjs') });
    try {
      const small = fromMinterms(['a', 'b', 'c'], [{ name: 'F', on: [1, 2, 4] }]);
      const r = await liar.minimiseCover(small);
      expect(r.methods).toEqual(['exact-fallback']);
      expect(coverMismatch(r.cover.outputs[0].cover, small.outputs[0], 3)).toBeUndefined();
      await expect(liar.minimiseCover(parityTable(11))).rejects.toMatchObject({ reason: 'mismatch' });
    } finally {
      liar.close();
    }
  });

  it('queues more requests than children and answers all of them', async () => {
    const m = createEspressoMinimiser({ size: 2 });
    try {
      const tables = [3, 4, 5, 6, 7].map((n) => parityTable(n));
      const results = await Promise.all(tables.map((t) => m.minimiseCover(t)));
      results.forEach((r, k) => expect(r.cover.outputs[0].cover).toHaveLength(2 ** (k + 2)));
      expect(m.pool.spawned).toBeLessThanOrEqual(2);
    } finally {
      m.close();
    }
  });
});

describe('sessions', () => {
  /** Two 8-input functions (seeded, each minterm on with probability 0.45). */
  function seededTables(): TruthTable[] {
    const names = ['a', 'b', 'c', 'd', 'e', 'f', 'g', 'h'];
    let s = 7;
    const rnd = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) >>> 8) / 16777216;
    return [0, 1].map(() => fromMinterms(names, [{ name: 'F', on: Array.from({ length: 256 }, (_, m) => m).filter(() => rnd() < 0.45) }]));
  }
  const text = (r: { cover: { inputs: string[]; outputs: { cover: Parameters<typeof coverToText>[0] }[] } }) => coverToText(r.cover.outputs[0].cover, r.cover.inputs);

  it('answer from their own calls only, whatever the minimiser they came from has done', async () => {
    const [first, second] = seededTables();
    const base = createEspressoMinimiser({ size: 1 });
    const inSession = async (fn: TruthTable) => {
      const s = base.session();
      try {
        return text(await s.minimiseCover(fn));
      } finally {
        s.close();
      }
    };
    try {
      const alone = await inSession(second);
      // Espresso's cover of a function depends on what its process minimised before (reduce.c
      // alternates its cube order on every call): the same child, having minimised another
      // function first, gives this one another cover.
      await base.minimiseCover(first);
      const afterAnother = text(await base.minimiseCover(second));
      expect(afterAnother).not.toBe(alone);
      expect(await inSession(second)).toBe(alone);
      expect(base.pool.liveChildren).toBe(1);
    } finally {
      base.close();
    }
  });
});

describe('batches of functions', () => {
  it('fails only the PLA that hangs, exits or errs, and answers the rest of the batch', async () => {
    const pool = new EspressoPool({ size: 1, workerPath: fixture('picky-worker.cjs') });
    try {
      // The timeout also covers starting a fresh child, slow on a busy machine: keep it generous.
      const answers = await pool.runEach(['a', 'b HANG', 'c', 'd EXIT', 'e', 'f THROW', 'g', 'h'], 1500);
      expect(answers.slice(0, 1)).toEqual(['a']);
      expect(answers[1]).toMatchObject({ reason: 'timeout' });
      expect(answers[2]).toBe('c');
      expect(answers[3]).toMatchObject({ reason: 'crashed' });
      expect(answers[4]).toBe('e');
      expect(answers[5]).toMatchObject({ reason: 'rejected' });
      expect(String((answers[5] as Error).message)).toMatch(/bad row/);
      expect(answers.slice(6)).toEqual(['g', 'h']);
      // The runTexts form of the same batch fails as a whole, with the first failure.
      await expect(pool.runTexts(['a', 'b THROW'], 1500)).rejects.toMatchObject({ reason: 'rejected' });
      expect(pool.childCpuMicros).toBeGreaterThan(0);
    } finally {
      pool.close();
    }
  });

  it('fails the rest of a batch after children die one after another without answering', async () => {
    const pool = new EspressoPool({ size: 1, workerPath: fixture('exiting-worker.cjs') });
    try {
      const answers = await pool.runEach(Array.from({ length: 10 }, (_, k) => `pla ${k}`), 5000);
      expect(answers.every((a) => a instanceof MinimiserError && a.reason === 'crashed')).toBe(true);
      // The batch, then two PLAs alone: three children, not one per PLA.
      expect(pool.spawned).toBe(3);
    } finally {
      pool.close();
    }
  });

  it('splits a batch between children and keeps the answers in order', async () => {
    const pool = new EspressoPool({ size: 3, workerPath: fixture('picky-worker.cjs') });
    try {
      const texts = Array.from({ length: 20 }, (_, k) => `pla ${k}`);
      expect(await pool.runEach(texts, 5000)).toEqual(texts);
      expect(pool.spawned).toBe(3);
      expect(await pool.runEach([], 5000)).toEqual([]);
    } finally {
      pool.close();
    }
    await expect(pool.runTexts(['a'])).rejects.toMatchObject({ reason: 'closed' });
  });

  it('sends each distinct function once, answers the others from it and fails bad functions alone', async () => {
    const m = createEspressoMinimiser({ size: 1 });
    try {
      const f = fromMinterms(['a', 'b', 'c'], [{ name: 'F', on: [1, 3, 5, 7], dc: [6] }]);
      const g = fromMinterms(['x', 'y', 'z'], [{ name: 'G', on: [1, 3, 5, 7], dc: [6] }, { name: 'H', on: [0, 1] }]);
      const wide = { inputs: Array.from({ length: 17 }, (_, i) => `i${i}`), outputs: [{ name: 'W', on: new Uint32Array(4096).fill(1), dc: new Uint32Array(4096) }] };
      const out = await m.minimiseMany([f, wide, g, f]);
      expect(out.map((o) => o.ok)).toEqual([true, false, true, true]);
      expect(out[1]).toMatchObject({ ok: false, error: { reason: 'rejected' } });
      const covers = out.flatMap((o) => (o.ok ? [o.result] : []));
      // F = c (the don't-care at 6 unused): Mano-style map reading, by hand.
      expect(coverToText(covers[0].cover.outputs[0].cover, ['a', 'b', 'c'])).toBe('c');
      expect(coverToText(covers[1].cover.outputs[0].cover, ['x', 'y', 'z'])).toBe('z');
      expect(coverToText(covers[1].cover.outputs[1].cover, ['x', 'y', 'z'])).toBe("x'y'");
      expect(covers[1].cover.inputs).toEqual(['x', 'y', 'z']);
      expect(covers[1].cover.outputs.map((o) => o.name)).toEqual(['G', 'H']);
      // F, G and the second F are one function: two PLAs in all (F and H), one round trip.
      expect(m.pool.sent).toBe(2);
      // Remembered by content: asking again sends nothing, and a caller changing a cover changes no later answer.
      covers[0].cover.outputs[0].cover.push({ care: 0, value: 0 });
      const again = await m.minimiseCover(g);
      expect(coverToText(again.cover.outputs[0].cover, ['x', 'y', 'z'])).toBe('z');
      expect(m.pool.sent).toBe(2);
      m.clearCache();
      await m.minimiseCover(g);
      expect(m.pool.sent).toBe(4);
    } finally {
      m.close();
    }
  });
});

describe('functions equal up to the order of their inputs', () => {
  it('are minimised once, each answered with a cover of its own table, in one batch and from memory', async () => {
    const m = createEspressoMinimiser({ size: 1 });
    try {
      // F = a + b'c over (a, b, c); G is F with its inputs listed as (c, a, b), H as (b, c, a).
      const f = fromMinterms(['a', 'b', 'c'], [{ name: 'F', on: [1, 4, 5, 6, 7] }]);
      const g = fromMinterms(['c', 'a', 'b'], [{ name: 'G', on: [2, 3, 6, 7, 4] }]);
      const h = fromMinterms(['b', 'c', 'a'], [{ name: 'H', on: [1, 3, 5, 7, 2] }]);
      const out = await m.minimiseMany([f, g]);
      expect(m.pool.sent).toBe(1);
      const text = (o: (typeof out)[number]) => (o.ok ? coverToText(o.result.cover.outputs[0].cover, o.result.cover.inputs) : String(o.error));
      // Terms and their literals in name order, whatever the table's input order.
      const sorted = (sop: string) => sop.split(' + ').map((t) => (t.match(/[a-z]'?/g) ?? []).sort().join('')).sort().join(' + ');
      expect(out.map((o) => sorted(text(o)))).toEqual(["a + b'c", "a + b'c"]);
      out.forEach((o, k) => o.ok && expect(coverMismatch(o.result.cover.outputs[0].cover, [f, g][k].outputs[0], 3)).toBeUndefined());
      const [later] = await m.minimiseMany([h]);
      expect(m.pool.sent).toBe(1);
      expect(sorted(text(later))).toBe("a + b'c");
    } finally {
      m.close();
    }
  });
});

describe('table payloads (the child writes the PLA rows)', () => {
  const requireCjs = createRequire(__filename);
  const { tableLines, tableText } = requireCjs('./pla-rows.cjs') as { tableLines(p: unknown): string[]; tableText(p: unknown): string };

  it('gives exactly the lines of the PLA text for any table', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 9 }).chain((n) => fc.tuple(fc.constant(n), fc.array(fc.constantFrom(0, 1, 2), { minLength: 2 ** n, maxLength: 2 ** n }))),
        ([n, cells]) => {
          const on = cells.flatMap((c, m) => (c === 1 ? [m] : []));
          const dc = cells.flatMap((c, m) => (c === 2 ? [m] : []));
          const t = fromMinterms(Array.from({ length: n }, (_, i) => `i${i}`), [{ name: 'F', on, dc }]);
          const p = tablePayload(t.outputs[0], n);
          if (on.length === 0) {
            expect(p).toMatch(/no on-set rows/);
            return;
          }
          expect(typeof p).toBe('object');
          expect(tableText(p)).toBe(buildPlaText(t.outputs[0], n));
          expect(tableLines(p)).toEqual(buildPla(t.outputs[0], n));
          expect(plaProblem(tableLines(p))).toBeUndefined();
        },
      ),
      { numRuns: 200 },
    );
  });

  it('refuses tables that are not well formed, on both sides of the process boundary', () => {
    const ok = fromMinterms(['a', 'b', 'c'], [{ name: 'F', on: [1], dc: [2] }]).outputs[0];
    expect(tablePayload({ ...ok, dc: Uint32Array.of(2) }, 3)).toMatch(/both on and don't-care/);
    expect(tablePayload({ ...ok, on: Uint32Array.of(1 << 9) }, 3)).toMatch(/past 7/);
    expect(tablePayload(ok, 17)).toMatch(/outside/);
    expect(tablePayload(ok, 6)).toMatch(/words, expected/);
    expect(() => tableLines({ n: 3, on: 'AgAAAA==', dc: 'AgAAAA==' })).toThrow(/both on/);
    expect(() => tableLines({ n: 3, on: 'AAAAAA==', dc: 'AAAAAA==' })).toThrow(/no on-set rows/);
    expect(() => tableLines({ n: 3, on: 'AA==', dc: 'AAAAAA==' })).toThrow(/bytes, expected 4/);
    expect(() => tableLines({ n: 0, on: '', dc: '' })).toThrow(/outside/);
    expect(() => tableLines({ n: 3, on: 'AAEAAA==', dc: 'AAAAAA==' })).toThrow(/outside 0..7/);
    expect(() => tableLines('x')).toThrow(/object/);
  });

  it('a payload the child refuses fails alone, without the native code seeing it', async () => {
    const m = createEspressoMinimiser({ size: 1 });
    try {
      const good = tablePayload(fromMinterms(['a', 'b'], [{ name: 'F', on: [3] }]).outputs[0], 2);
      const answers = await m.pool.runEach([good as TablePayload, { n: 2, on: 'AAAAAA==', dc: 'AAAAAA==' }, good as TablePayload], 5000);
      expect(answers[0]).toBe('11 1');
      expect(answers[1]).toMatchObject({ reason: 'rejected' });
      expect(answers[2]).toBe('11 1');
    } finally {
      m.close();
    }
  });
});
