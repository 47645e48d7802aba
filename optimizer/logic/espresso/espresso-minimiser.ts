// Minimiser backed by the Espresso process pool: constants answered here (never sent), each PLA
// validated before sending, and every returned cover checked against the truth table on the care
// set before it is believed — a wrong cover falls back to the exact minimiser or is an error.
import { InternalError } from '../../errors';
import { type Cover, coverMismatch } from '../cubes';
import type { MinimiseMethod, MinimiseResult, Minimiser, MinimiseOptions } from '../minimiser';
import { MAX_QM_INPUTS, minimiseOutputQm } from '../quine-mccluskey';
import { constantValue, type OutputTable, type TruthTable } from '../truth-table';
import { EspressoPool, MinimiserError, type PoolOptions } from './pool';
import { buildPlaText, MAX_ESPRESSO_INPUTS, parseCubes, plaTextProblem } from './pla';

/** Inputs up to which a cover Espresso got wrong is recomputed exactly instead of failing. */
export const EXACT_FALLBACK_INPUTS = 10;

export interface EspressoMinimiser extends Minimiser {
  readonly pool: EspressoPool;
  close(): void;
  /** Forgets remembered covers (benchmarks time fresh calls). */
  clearCache(): void;
}

/** Covers remembered per function (bit slices repeat the same blocks); re-checked on every use. */
const CACHE_ENTRIES = 512;

/** FNV-1a over the on-set and don't-care words: the function's key without building its PLA. */
function tableKey(out: OutputTable, n: number): string {
  let h = 0x811c9dc5;
  for (const set of [out.on, out.dc]) {
    for (let w = 0; w < set.length; w++) h = Math.imul(h ^ set[w], 0x01000193);
    h = Math.imul(h ^ 0x2c, 0x01000193);
  }
  return `${n}:${(h >>> 0).toString(16)}`;
}

export function createEspressoMinimiser(options: PoolOptions & { pool?: EspressoPool } = {}): EspressoMinimiser {
  const pool = options.pool ?? new EspressoPool(options);
  const cache = new Map<string, Cover>();

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

  return {
    name: 'espresso',
    pool,
    close: () => pool.close(),
    clearCache: () => cache.clear(),
    async minimiseCover(fn: TruthTable, opts: MinimiseOptions = {}): Promise<MinimiseResult> {
      const n = fn.inputs.length;
      const results: { cover: Cover; method: MinimiseMethod }[] = new Array(fn.outputs.length);
      const pending: { k: number; text?: string; key: string }[] = [];
      fn.outputs.forEach((out, k) => {
        const constant = constantValue(out, n);
        if (constant === 0) results[k] = { cover: [], method: 'constant' };
        else if (constant === 1) results[k] = { cover: [{ care: 0, value: 0 }], method: 'constant' };
        else {
          if (n > MAX_ESPRESSO_INPUTS) {
            throw new MinimiserError('rejected', `functions of more than ${MAX_ESPRESSO_INPUTS} inputs are not sent to the minimiser (got ${n})`);
          }
          const key = tableKey(out, n);
          const hit = cache.get(key);
          // A remembered cover is believed only after the same check a fresh one gets.
          if (hit && !coverMismatch(hit, out, n)) results[k] = { cover: hit, method: 'espresso' };
          else pending.push({ k, key });
        }
      });
      if (pending.length) {
        // Built and validated only on a cache miss; every non-constant output in one round trip.
        const texts = pending.map((p) => {
          const text = buildPlaText(fn.outputs[p.k], n);
          const problem = plaTextProblem(text);
          if (problem) throw new InternalError(`built an unsafe PLA for ${fn.outputs[p.k].name}: ${problem}`);
          return text;
        });
        const answers = await pool.runTexts(texts, opts.timeoutMs);
        pending.forEach((p, i) => {
          const r = accept(fn.outputs[p.k], n, parseCubes(answers[i] === '' ? [] : answers[i].split('\n'), n));
          results[p.k] = r;
          if (r.method === 'espresso') {
            if (cache.size >= CACHE_ENTRIES) cache.delete(cache.keys().next().value!);
            cache.set(p.key, r.cover);
          }
        });
      }
      return {
        cover: { inputs: [...fn.inputs], outputs: fn.outputs.map((o, k) => ({ name: o.name, cover: results[k].cover })) },
        methods: results.map((r) => r.method),
      };
    },
  };
}
