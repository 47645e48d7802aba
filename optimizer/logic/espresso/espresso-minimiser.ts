// Minimiser backed by the Espresso process pool: constants answered here (never sent), each
// distinct function sent once per batch after its table is checked, and every returned cover
// checked against the truth table on the care set before it is believed (a wrong cover falls back
// to the exact minimiser or is an error); checked covers are remembered by the table's content,
// with its inputs in a name-free order, so a block whose inputs sort differently shares them.
import { InternalError } from '../../errors';
import { type Cover, coverMismatch } from '../cubes';
import type { MinimiseMethod, MinimiseOutcome, MinimiseResult, Minimiser, MinimiseOptions } from '../minimiser';
import { MAX_QM_INPUTS, minimiseOutputQm } from '../quine-mccluskey';
import { constantValue, type OutputTable, type TruthTable } from '../truth-table';
import { EspressoPool, MinimiserError, type PoolOptions } from './pool';
import { canonicalOrder, inverseOrder, reorderCover, reorderOutput } from './input-order';
import { MAX_ESPRESSO_INPUTS, parseCubesText, tablePayload, type TablePayload } from './pla';

/** Inputs up to which a cover Espresso got wrong is recomputed exactly instead of failing. */
export const EXACT_FALLBACK_INPUTS = 10;

export interface EspressoMinimiser extends Minimiser {
  readonly pool: EspressoPool;
  /** A minimiser with a pool and memory of its own, its children started afresh (see Minimiser.session). */
  session(): EspressoMinimiser;
  minimiseMany(fns: readonly TruthTable[], options?: MinimiseOptions): Promise<MinimiseOutcome[]>;
  close(): void;
  /** Forgets remembered covers (benchmarks time fresh calls). */
  clearCache(): void;
}

/** Covers remembered per function (bit slices repeat the same blocks), oldest forgotten first. */
const CACHE_ENTRIES = 512;

/**
 * The function itself as a key: input count, then the on-set and don't-care words as raw bytes
 * (of the table with its inputs in canonicalOrder). Equal keys are tables equal up to the order
 * of their inputs; a cover moved from one to the other is still checked before it is used.
 */
function tableKey(out: OutputTable, n: number): string {
  // Two UTF-16 code units per word, decoded natively from the words' bytes.
  const chars = (set: Uint32Array) => Buffer.from(set.buffer, set.byteOffset, set.byteLength).toString('utf16le');
  return `${n}:${chars(out.on)}|${chars(out.dc)}`;
}

/** A checked cover with its inputs in canonical order, and the input order of the table it was checked on. */
interface Remembered {
  cover: Cover;
  order: number[];
}

const sameOrder = (a: readonly number[], b: readonly number[]) => a.every((x, i) => x === b[i]);

type Answer = { cover: Cover; method: MinimiseMethod } | { error: Error };

/** One output that wants a function: where it is, its own table, and its inputs' canonical order. */
interface User {
  f: number;
  k: number;
  out: OutputTable;
  order: number[];
}

/** A distinct non-constant function to send (its first user's table), and the outputs that want it. */
interface Wanted {
  out: OutputTable;
  n: number;
  users: User[];
  answer?: Answer;
  /** The checked cover in canonical order, once the minimiser has answered. */
  canonical?: Remembered;
}

export function createEspressoMinimiser(options: PoolOptions & { pool?: EspressoPool } = {}): EspressoMinimiser {
  const { pool: given, ...poolOptions } = options;
  const pool = given ?? new EspressoPool(poolOptions);
  const cache = new Map<string, Remembered>();

  /** A cover is believed only if it equals the output on the care set; else exact or an error. */
  function accept(out: OutputTable, n: number, cover: Cover): { cover: Cover; method: MinimiseMethod } {
    const wrong = coverMismatch(cover, out, n);
    if (!wrong) return { cover, method: 'espresso' };
    if (n <= Math.min(EXACT_FALLBACK_INPUTS, MAX_QM_INPUTS)) return { cover: minimiseOutputQm(out, n).cover, method: 'exact-fallback' };
    throw new MinimiserError(
      'mismatch',
      `the minimiser's cover of ${out.name} is wrong at minterm ${wrong.minterm} (expected ${wrong.expected}); not used`,
    );
  }

  /**
   * A remembered cover moved to a user's input order. Equal keys and equal orders mean the very
   * table it was checked on; a cover moved between orders is checked again on the user's table.
   */
  function moved(r: Remembered, user: User, n: number): Cover | undefined {
    const cover = reorderCover(r.cover, n, inverseOrder(user.order));
    return sameOrder(r.order, user.order) || !coverMismatch(cover, user.out, n) ? cover : undefined;
  }

  async function minimiseMany(fns: readonly TruthTable[], opts: MinimiseOptions = {}): Promise<MinimiseOutcome[]> {
    const answers: Answer[][] = new Array(fns.length);
    const wanted = new Map<string, Wanted>();
    // Plain loops: this runs for every call, and a scan of a small design makes one call per block.
    for (let f = 0; f < fns.length; f++) {
      const fn = fns[f];
      const n = fn.inputs.length;
      const row = (answers[f] = new Array<Answer>(fn.outputs.length));
      for (let k = 0; k < fn.outputs.length; k++) {
        const out = fn.outputs[k];
        const constant = constantValue(out, n);
        if (constant === 0) row[k] = { cover: [], method: 'constant' };
        else if (constant === 1) row[k] = { cover: [{ care: 0, value: 0 }], method: 'constant' };
        else if (n > MAX_ESPRESSO_INPUTS) {
          row[k] = { error: new MinimiserError('rejected', `functions of more than ${MAX_ESPRESSO_INPUTS} inputs are not sent to the minimiser (got ${n})`) };
        } else {
          const order = canonicalOrder(out, n);
          const key = tableKey(reorderOutput(out, n, order), n);
          const user: User = { f, k, out, order };
          const hit = cache.get(key);
          const cover = hit && moved(hit, user, n);
          if (cover) row[k] = { cover, method: 'espresso' };
          else {
            const w = wanted.get(key);
            if (w) w.users.push(user);
            else wanted.set(key, { out, n, users: [user] });
          }
        }
      }
    }
    // Each distinct function once, built and validated here, all of them in one batch.
    // The child writes each PLA's rows from the checked table words: a few bytes each way.
    const send: { key: string; w: Wanted; item: TablePayload }[] = [];
    for (const [key, w] of wanted) {
      const item = tablePayload(w.out, w.n);
      if (typeof item === 'string') w.answer = { error: new InternalError(`built an unsafe PLA for ${w.out.name}: ${item}`) };
      else send.push({ key, w, item });
    }
    const replies = send.length ? await pool.runEach(send.map((x) => x.item), opts.timeoutMs) : [];
    for (let i = 0; i < send.length; i++) {
      const { key, w } = send[i];
      const reply = replies[i];
      if (reply instanceof Error) {
        w.answer = { error: reply };
        continue;
      }
      try {
        const r = accept(w.out, w.n, parseCubesText(reply, w.n));
        w.answer = r;
        const source = w.users[0].order;
        const canonical = { cover: reorderCover(r.cover, w.n, source), order: source };
        w.canonical = canonical;
        if (r.method === 'espresso') {
          if (cache.size >= CACHE_ENTRIES) cache.delete(cache.keys().next().value!);
          cache.set(key, canonical);
        }
      } catch (err) {
        w.answer = { error: err instanceof Error ? err : new Error(String(err)) };
      }
    }
    for (const w of wanted.values()) {
      const a = w.answer!;
      // The first user sent its own table; the others get the cover moved to their input order.
      const canonical = w.canonical;
      for (let u = 0; u < w.users.length; u++) {
        const user = w.users[u];
        if (!canonical || 'error' in a || u === 0) {
          answers[user.f][user.k] = a;
          continue;
        }
        const cover = moved(canonical, user, w.n);
        answers[user.f][user.k] = cover
          ? { cover, method: a.method }
          : { error: new InternalError(`the cover of ${w.out.name} does not fit ${user.out.name}, whose table differs only in input order`) };
      }
    }
    // A function fails with its first failing output, as a single request would.
    return fns.map((fn, f): MinimiseOutcome => {
      const failed = answers[f].find((a): a is { error: Error } => 'error' in a);
      if (failed) return { ok: false, error: failed.error };
      const done = answers[f] as { cover: Cover; method: MinimiseMethod }[];
      return {
        ok: true,
        result: {
          cover: { inputs: [...fn.inputs], outputs: fn.outputs.map((o, k) => ({ name: o.name, cover: done[k].cover })) },
          methods: done.map((a) => a.method),
        },
      };
    });
  }

  return {
    name: 'espresso',
    pool,
    close: () => pool.close(),
    clearCache: () => cache.clear(),
    session: () => createEspressoMinimiser(poolOptions),
    minimiseMany,
    async minimiseCover(fn: TruthTable, opts: MinimiseOptions = {}): Promise<MinimiseResult> {
      const [outcome] = await minimiseMany([fn], opts);
      if (!outcome.ok) throw outcome.error;
      return outcome.result;
    },
  };
}
