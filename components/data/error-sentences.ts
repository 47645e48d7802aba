// Turns any failure from the API client into one sentence a person can act on. Screens show
// only what this returns, so wording stays consistent across the app.
import { ApiError } from './api-error';

const BY_CODE: Record<string, string> = {
  'bad-credentials': 'That e-mail and password do not match an account. Check both and try again.',
  'token-invalid': 'This link has expired or has already been used. Ask for a new one.',
  'last-admin': 'A team needs at least one admin. Make someone else an admin first.',
  'already-member': 'That person is already a member of this team.',
  csrf: 'Your session changed in another window. Reload the page and try again.',
  'rate-limited': 'Too many attempts in a short time. Wait a few minutes and try again.',
  network: 'Trimwire cannot be reached. Check your connection and try again.',
  // Review workflow.
  'revision-moved': 'Someone made a newer revision of this design meanwhile. Nothing was changed; reload and apply again on the latest revision.',
  'proposals-overlap': 'Some of these proposals change the same parts, so they cannot be applied together. Nothing was changed; run a new scan and decide again.',
  'not-accepted': 'Only accepted proposals can be applied. Nothing was changed; reload to see their current status.',
  'own-scan': 'You started the scan that found this proposal, so another reviewer has to decide it.',
  'not-open': 'This proposal has already been decided or is out of date. Reload to see its current status.',
  'scan-finished': 'This scan has already finished, so there is nothing to cancel.',
  'export-unsupported': 'This revision cannot be written in that format.',
};

const BY_STATUS: Record<number, string> = {
  400: 'Some of what you entered is not valid. Check the fields and try again.',
  401: 'You are signed out. Sign in again to continue.',
  403: 'Your role in this team does not allow this.',
  404: 'That item no longer exists.',
  409: 'That conflicts with the current state of the team. Reload and try again.',
  413: 'That is too large to send.',
  429: 'Too many attempts in a short time. Wait a few minutes and try again.',
};

export function errorSentence(error: unknown): string {
  if (error instanceof ApiError) {
    const byCode = BY_CODE[error.code];
    if (byCode) return byCode;
    // A validation failure carries the server's own field message, which is more useful than ours.
    if (error.status === 400 && error.message) return error.message.endsWith('.') ? error.message : `${error.message}.`;
    if (error.status === 409 && error.message) return error.message.endsWith('.') ? error.message : `${error.message}.`;
    const byStatus = BY_STATUS[error.status];
    if (byStatus) return byStatus;
    if (error.status >= 500) return 'Something went wrong on the server. Try again in a moment.';
  }
  return 'Something went wrong. Try again in a moment.';
}
