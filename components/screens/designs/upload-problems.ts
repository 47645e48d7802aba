// Turns a refused upload into what the form shows: located diagnostics (file:line:col) for a
// parse error, field messages for a validation error, or one sentence for anything else.
import { ApiError } from '@/components/data/api-error';
import { errorSentence } from '@/components/data/error-sentences';
import type { UploadDiagnostic } from '@/shared/api/designs';

export type UploadProblems = { summary: string; diagnostics: UploadDiagnostic[] };

export function locationOf(d: Pick<UploadDiagnostic, 'file' | 'line' | 'col'>, fallbackFile: string): string | null {
  if (d.line === null) return null;
  return `${d.file ?? fallbackFile}:${d.line}${d.col !== null ? `:${d.col}` : ''}`;
}

export function uploadProblems(error: unknown): UploadProblems {
  if (error instanceof ApiError && error.code === 'parse-error') {
    const raw = (error.details as { diagnostics?: unknown } | undefined)?.diagnostics;
    // Errors first (they are why the file was refused), then warnings, each in file order.
    const rank = (d: UploadDiagnostic) => (d.severity === 'error' ? 0 : 1);
    const diagnostics = (Array.isArray(raw) ? (raw as UploadDiagnostic[]) : []).map((d, i) => ({ d, i })).sort((a, b) => rank(a.d) - rank(b.d) || a.i - b.i).map(({ d }) => d);
    const errors = diagnostics.filter((d) => d.severity === 'error').length;
    return {
      summary: `The file could not be read (${errors || diagnostics.length} problem${(errors || diagnostics.length) === 1 ? '' : 's'}). Nothing was stored; fix the file and upload it again.`,
      diagnostics,
    };
  }
  return { summary: errorSentence(error), diagnostics: [] };
}
