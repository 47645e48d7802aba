// Proves every failure becomes one readable sentence, chosen by error code first, then status.
import { describe, expect, it } from 'vitest';
import { ApiError } from './api-error';
import { errorSentence } from './error-sentences';

describe('errorSentence', () => {
  it.each([
    ['bad-credentials', 401, /e-mail and password do not match/],
    ['token-invalid', 400, /expired or has already been used/],
    ['last-admin', 409, /at least one admin/],
    ['csrf', 403, /Reload the page/],
    ['rate-limited', 429, /Too many attempts/],
    ['network', 0, /cannot be reached/],
    ['revision-moved', 409, /newer revision .* Nothing was changed/],
    ['proposals-overlap', 409, /change the same parts/],
    ['not-accepted', 409, /Only accepted proposals/],
    ['own-scan', 403, /another reviewer/],
  ])('code %s (status %i) has its own sentence', (code, status, expected) => {
    expect(errorSentence(new ApiError(status, code, 'raw server text'))).toMatch(expected);
  });

  it('prefers the code over the status: a 401 bad-credentials is not "you are signed out"', () => {
    expect(errorSentence(new ApiError(401, 'bad-credentials', ''))).not.toMatch(/signed out/);
    expect(errorSentence(new ApiError(401, 'unauthorized', ''))).toMatch(/signed out/);
  });

  it('passes through the server message of a validation failure as a sentence', () => {
    expect(errorSentence(new ApiError(400, 'bad-request', 'email: Invalid email address'))).toBe('email: Invalid email address.');
  });

  it('falls back to a sentence per status when the code is unknown', () => {
    expect(errorSentence(new ApiError(403, 'forbidden', ''))).toMatch(/role in this team does not allow/);
    expect(errorSentence(new ApiError(404, 'not-found', ''))).toMatch(/no longer exists/);
    expect(errorSentence(new ApiError(413, 'too-large', ''))).toMatch(/too large/);
  });

  it('never shows a server fault to the person as-is', () => {
    const sentence = errorSentence(new ApiError(500, 'internal', 'TypeError: cannot read x of undefined'));
    expect(sentence).toMatch(/went wrong on the server/);
    expect(sentence).not.toMatch(/TypeError/);
  });

  it('handles things that are not ApiErrors', () => {
    expect(errorSentence(new Error('boom'))).toBe('Something went wrong. Try again in a moment.');
    expect(errorSentence(undefined)).toBe('Something went wrong. Try again in a moment.');
  });
});
