// Proves an assumption parse failure is located by its column wherever the server puts it, and
// that other failures fall back to the app's usual sentences.
import { describe, expect, it } from 'vitest';
import { ApiError } from '@/components/data/api-error';
import { assumptionProblem, caretLine } from './assumption-error';

describe('assumptionProblem', () => {
  it('reads the column from details.col and prefixes it when the message lacks it', () => {
    const p = assumptionProblem(new ApiError(400, 'assumption-parse', 'unexpected ")"', { col: 7 }));
    expect(p).toEqual({ col: 7, message: 'Column 7: unexpected ")"' });
  });
  it('reads the column from the first diagnostic and keeps a message that already names it', () => {
    const p = assumptionProblem(new ApiError(400, 'assumption-parse', 'column 3: unknown net "clr"', { diagnostics: [{ col: 3 }] }));
    expect(p).toEqual({ col: 3, message: 'column 3: unknown net "clr"' });
  });
  it('falls back to the sentence of any other failure, without a column', () => {
    expect(assumptionProblem(new ApiError(403, 'forbidden', ''))).toEqual({ col: null, message: expect.stringMatching(/role/) });
  });
});

describe('caretLine', () => {
  it('puts the caret under the 1-based column', () => {
    expect(caretLine(1)).toBe('^');
    expect(caretLine(4)).toBe('   ^');
  });
});
