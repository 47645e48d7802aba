// Rate limits on the routes attackers hammer: failed sign-ins, and requests that send mail
// (invites, password resets). Limits come from the env so tests can lower them.
import { rateLimit, type RateLimitRequestHandler } from 'express-rate-limit';
import { TooManyRequests } from '@/server/http/errors';

export type RateLimits = {
  signIn: RateLimitRequestHandler;
  mail: RateLimitRequestHandler;
};

export function createRateLimits(opts: { signInLimit: number; mailLimit: number }): RateLimits {
  const common = {
    standardHeaders: 'draft-8' as const,
    legacyHeaders: false,
    handler: (_req: unknown, _res: unknown, next: (err: unknown) => void) => next(new TooManyRequests()),
  };
  return {
    // Only failures count, so a team signing in from one office address is not locked out.
    signIn: rateLimit({ ...common, windowMs: 15 * 60_000, limit: opts.signInLimit, skipSuccessfulRequests: true }),
    mail: rateLimit({ ...common, windowMs: 60 * 60_000, limit: opts.mailLimit }),
  };
}
