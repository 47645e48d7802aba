// The two-level minimiser seen by the pure engine: an interface the rules take as a parameter, so
// the server and CLI can pass the Espresso process pool and tests or the browser the exact one.
import type { MultiCover } from './cubes';
import { MAX_QM_INPUTS, minimiseOutputQm } from './quine-mccluskey';
import { constantValue, type TruthTable } from './truth-table';
import { InputError } from '../errors';

/** How each output's cover was obtained. */
export type MinimiseMethod = 'constant' | 'espresso' | 'exact' | 'exact-fallback';

export interface MinimiseResult {
  cover: MultiCover;
  /** One per output, in output order. */
  methods: MinimiseMethod[];
}

export interface MinimiseOptions {
  /** Per-output limit on the minimiser's run (the process pool kills a child past it). */
  timeoutMs?: number;
}

/** One function's result from a batch, or why that function alone could not be minimised. */
export type MinimiseOutcome = { ok: true; result: MinimiseResult } | { ok: false; error: Error };

export interface Minimiser {
  readonly name: string;
  minimiseCover(fn: TruthTable, options?: MinimiseOptions): Promise<MinimiseResult>;
  /**
   * Many functions at once, one outcome each in order (a minimiser in another process answers
   * them in one round trip). A failure fails its own function only.
   */
  minimiseMany?(fns: readonly TruthTable[], options?: MinimiseOptions): Promise<MinimiseOutcome[]>;
  /**
   * A minimiser of its own for one scan, whose answers depend only on the calls made through it;
   * close it when the scan ends. A heuristic minimiser's cover can depend on what the same
   * process minimised before (Espresso's reduce step alternates its cube order on every call,
   * through a static flag in reduce.c), so a scan served by a long-lived minimiser could report
   * other savings for the same design depending on what ran before it. Absent when every answer
   * depends on its function alone.
   */
  session?(): Minimiser & { close(): void };
}

/** Minimises every function, batched where the minimiser can batch, one by one where it cannot. */
export async function minimiseAll(m: Minimiser, fns: readonly TruthTable[], options?: MinimiseOptions): Promise<MinimiseOutcome[]> {
  if (m.minimiseMany) return m.minimiseMany(fns, options);
  const out: MinimiseOutcome[] = [];
  for (const fn of fns) {
    try {
      out.push({ ok: true, result: await m.minimiseCover(fn, options) });
    } catch (err) {
      out.push({ ok: false, error: err instanceof Error ? err : new Error(String(err)) });
    }
  }
  return out;
}

/** Exact Quine–McCluskey minimiser: pure and in-process, for small functions. */
export const exactMinimiser: Minimiser = {
  name: 'quine-mccluskey',
  async minimiseCover(fn) {
    const n = fn.inputs.length;
    if (n > MAX_QM_INPUTS) {
      throw InputError.at('logic.qm-too-large', `exact minimisation is limited to ${MAX_QM_INPUTS} inputs, got ${n}`);
    }
    const methods: MinimiseMethod[] = [];
    const outputs = fn.outputs.map((o) => {
      methods.push(constantValue(o, n) === undefined ? 'exact' : 'constant');
      return { name: o.name, cover: minimiseOutputQm(o, n).cover };
    });
    return { cover: { inputs: [...fn.inputs], outputs }, methods };
  },
};
