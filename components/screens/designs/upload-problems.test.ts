// Proves a parse-error answer becomes located lines and a summary that says nothing was stored.
import { describe, expect, it } from 'vitest';
import { ApiError } from '@/components/data/api-error';
import { locationOf, uploadProblems } from './upload-problems';

describe('uploadProblems', () => {
  it('keeps the diagnostics of a parse error and counts the errors', () => {
    const diagnostics = [
      { severity: 'warning', code: 'unused-model', message: 'model QX is never used', line: 2, col: 1, file: 'bus.cir' },
      { severity: 'error', code: 'unknown-card', message: 'unknown card .foo', line: 4, col: 1, file: 'bus.cir' },
    ];
    const p = uploadProblems(new ApiError(400, 'parse-error', 'The file could not be read', { diagnostics }));
    expect(p.diagnostics).toHaveLength(2);
    expect(p.diagnostics[0].severity).toBe('error');
    expect(p.summary).toMatch(/1 problem\)\. Nothing was stored/);
  });
  it('turns any other failure into the usual sentence, with no diagnostics', () => {
    expect(uploadProblems(new ApiError(413, 'too-large', ''))).toEqual({ summary: expect.stringMatching(/too large/), diagnostics: [] });
  });
});

describe('locationOf', () => {
  it('writes file:line:col, using the picked file name when the server gives none', () => {
    expect(locationOf({ file: null, line: 12, col: 5 }, 'alu.v')).toBe('alu.v:12:5');
    expect(locationOf({ file: 'a.cir', line: 3, col: null }, 'x')).toBe('a.cir:3');
    expect(locationOf({ file: 'a.cir', line: null, col: null }, 'x')).toBeNull();
  });
});
