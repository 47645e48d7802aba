// The messages between a scan's engine thread (engine-thread.ts) and the worker's main thread
// (engine-host.ts): what the thread is given, what it reports per stage, how it asks the main
// thread's Espresso pool to minimise, and the result or error it ends with. All plain data, so
// they cross postMessage by structured clone.
import type { ReadOptions } from '@/optimizer/formats/index';
import type { MapFamily } from '@/optimizer/logic/family-parts';
import type { MinimiseOptions, MinimiseResult } from '@/optimizer/logic/minimiser';
import type { TruthTable } from '@/optimizer/logic/truth-table';
import type { OverlapGraph, RuleErrorRecord } from '@/optimizer/rules/run-rules';
import type { ScannedFinding } from '@/optimizer/rules/scan';

/** Everything the thread needs to run one scan (sent in a `job` message). */
export type EngineJob = {
  source: string;
  fileName: string;
  format: ReadOptions['format'];
  /** Rule ids, in the order they run (already checked against the catalogue). */
  rules: string[];
  assumptions: { id: string; text: string }[];
  targetFamily: MapFamily;
  /** Seconds, or undefined when the design states no clock period. */
  clockPeriod?: number;
  /** Name of the main thread's minimiser, or null to use the engine's default in the thread. */
  minimiser: string | null;
  /** Test knob: the thread blocks (a synchronous wait) this long at the start of every stage. */
  stageDelayMs: number;
};

/** Only the device paths the stored proposals look up (store-results files proposals onto boards). */
export type DevicePath = { name: string; path: string[] };

export type EngineResult = {
  findings: ScannedFinding[];
  overlaps: OverlapGraph;
  ruleErrors: RuleErrorRecord[];
  devices: DevicePath[];
  /** Milliseconds of engine work per stage, measured in the thread (the stage delay excluded). */
  timings: Record<string, number>;
};

/** A thrown error as data: `input` marks the engine's InputError (bad design or assumption). */
export type EngineFailure = { input: boolean; name: string; message: string; stack?: string };

export type ThreadMessage =
  /** Sent as a stage starts, with the times of the stages finished so far. */
  | { type: 'stage'; name: string; progress: number; timings: Record<string, number> }
  /** A batch of functions for the main thread's minimiser (one call, as the rules batch them). */
  | { type: 'minimise'; id: number; fns: TruthTable[]; options?: MinimiseOptions }
  /** `heapMb`: the thread's heap in use after the job (the host retires a thread that grew large). */
  | { type: 'result'; result: EngineResult; heapMb: number }
  | { type: 'error'; error: EngineFailure; timings: Record<string, number>; heapMb: number };

export type HostMessage =
  | { type: 'job'; job: EngineJob }
  | { type: 'minimised'; id: number; outcomes: WireOutcome[] }
  | { type: 'minimise-failed'; id: number; error: WireError };

/** An error as data; `reason` is the Espresso pool's failure kind when it has one. */
export type WireError = { name: string; message: string; reason?: string };
export type WireOutcome = { ok: true; result: MinimiseResult } | { ok: false; error: WireError };

export function wireError(err: unknown): WireError {
  const e = err instanceof Error ? err : new Error(String(err));
  const reason = (e as { reason?: unknown }).reason;
  return { name: e.name, message: e.message, ...(typeof reason === 'string' ? { reason } : {}) };
}
