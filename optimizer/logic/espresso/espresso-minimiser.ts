// Minimiser backed by the Espresso process pool: constants answered here (never sent), each PLA
// validated before sending, and every returned cover checked against the truth table on the care
// set before it is believed — a wrong cover falls back to the exact minimiser or is an error.
import { InternalError } from '../../errors';
import { type Cover, coverMismatch } from '../cubes';
import type { MinimiseMethod, MinimiseResult, Minimiser, MinimiseOptions } from '../minimiser';
import { MAX_QM_INPUTS, minimiseOutputQm } from '../quine-mccluskey';
import { constantValue, type OutputTable, type TruthTable } from '../truth-table';
import { EspressoPool, MinimiserError, type PoolOptions } from './pool';
import { buildPla, MAX_ESPRESSO_INPUTS, parseCubes, plaProblem } from './pla';

/** Inputs up to which a cover Espresso got wrong is recomputed exactly instead of failing. */
export const EXACT_FALLBACK_INPUTS = 10;

export interface EspressoMinimiser extends Minimiser {
  readonly pool: EspressoPool;
  close(): void;
}

export function createEspressoMinimiser(options: PoolOptions & { pool?: EspressoPool } = {}): EspressoMinimiser {
  const pool = options.pool ?? new EspressoPool(options);

  async function one(out: OutputTable, n: number, opts: MinimiseOptions): Promise<{ cover: Cover; method: MinimiseMethod }> {
    const constant = constantValue(out, n);
    if (constant === 0) return { cover: [], method: 'constant' };
    if (constant === 1) return { cover: [{ care: 0, value: 0 }], method: 'constant' };
    if (n > MAX_ESPRESSO_INPUTS) {
      throw new MinimiserError('rejected', `functions of more than ${MAX_ESPRESSO_INPUTS} inputs are not sent to the minimiser (got ${n})`);
    }
    const lines = buildPla(out, n);
    const problem = plaProblem(lines);
    if (problem) throw new InternalError(`built an unsafe PLA for ${out.name}: ${problem}`);
    const cover = parseCubes(await pool.run(lines, opts.timeoutMs), n);
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
    async minimiseCover(fn: TruthTable, opts: MinimiseOptions = {}): Promise<MinimiseResult> {
      const n = fn.inputs.length;
      const results = await Promise.all(fn.outputs.map((o) => one(o, n, opts)));
      return {
        cover: { inputs: [...fn.inputs], outputs: fn.outputs.map((o, k) => ({ name: o.name, cover: results[k].cover })) },
        methods: results.map((r) => r.method),
      };
    },
  };
}
