// Reads where an assumption expression went wrong from a 400 "assumption-parse" answer, so the
// form can point at the column instead of only repeating the message.
import { ApiError } from '@/components/data/api-error';
import { errorSentence } from '@/components/data/error-sentences';

export type LocatedProblem = { message: string; col: number | null };

function colOf(details: unknown): number | null {
  if (!details || typeof details !== 'object') return null;
  const d = details as { col?: unknown; column?: unknown; diagnostics?: unknown };
  if (typeof d.col === 'number') return d.col;
  if (typeof d.column === 'number') return d.column;
  if (Array.isArray(d.diagnostics) && d.diagnostics.length > 0) return colOf(d.diagnostics[0]);
  return null;
}

export function assumptionProblem(error: unknown): LocatedProblem {
  if (error instanceof ApiError && error.code === 'assumption-parse') {
    const col = colOf(error.details);
    const message = error.message || 'The expression could not be read.';
    return { message: col !== null && !/column/i.test(message) ? `Column ${col}: ${message}` : message, col };
  }
  return { message: errorSentence(error), col: null };
}

/** A caret line under the expression pointing at a 1-based column. */
export function caretLine(col: number): string {
  return `${' '.repeat(Math.max(0, col - 1))}^`;
}
