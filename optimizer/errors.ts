// Typed engine errors: who was wrong decides the type. Input errors are the caller's (a located
// problem in a file or expression), rule errors are one rule's crash, internal errors are our bugs.
import type { SourceLoc } from './netlist/ir';

export interface Diagnostic {
  severity: 'error' | 'warning';
  message: string;
  loc?: SourceLoc;
  /** Stable code for tests and UIs, e.g. "spice.unknown-model". */
  code: string;
}

/** Formats a location the way compilers do: file:line:col. */
export function formatLoc(loc: SourceLoc | undefined): string {
  return loc ? `${loc.file}:${loc.line}:${loc.col}` : '';
}

export function formatDiagnostic(d: Diagnostic): string {
  const where = formatLoc(d.loc);
  return `${where ? where + ': ' : ''}${d.severity === 'warning' ? 'warning: ' : ''}${d.message}`;
}

/** The input (a file, an expression, an option) is wrong; carries every located problem found. */
export class InputError extends Error {
  readonly diagnostics: Diagnostic[];
  constructor(diagnostics: Diagnostic[]) {
    super(diagnostics.filter((d) => d.severity === 'error').map(formatDiagnostic).join('\n') || 'invalid input');
    this.name = 'InputError';
    this.diagnostics = diagnostics;
  }
  static at(code: string, message: string, loc?: SourceLoc): InputError {
    return new InputError([{ severity: 'error', code, message, loc }]);
  }
}

/** A rule crashed or broke its contract on one element; the scan records it and goes on. */
export class RuleError extends Error {
  constructor(
    readonly ruleId: string,
    message: string,
    readonly element?: string,
  ) {
    super(`rule ${ruleId}${element ? ` at ${element}` : ''}: ${message}`);
    this.name = 'RuleError';
  }
}

/** A broken invariant inside the engine: a bug in Trimwire, never the user's fault. */
export class InternalError extends Error {
  constructor(message: string) {
    super(`internal error (a bug in Trimwire): ${message}`);
    this.name = 'InternalError';
  }
}
