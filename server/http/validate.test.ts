// validate() hands handlers parsed values and turns every bad part into one 400 naming the fields.
import type { Request } from 'express';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { BadRequest } from '@/server/http/errors';
import { validate } from '@/server/http/validate';

const req = (parts: { body?: unknown; query?: object; params?: object }) =>
  ({ body: parts.body, query: parts.query ?? {}, params: parts.params ?? {} }) as unknown as Request;

const Body = z.strictObject({ email: z.string().trim().toLowerCase(), n: z.number().optional() });

describe('validate', () => {
  it('returns the parsed (normalised) values', () => {
    const out = validate(req({ body: { email: '  A@B.Test ' } }), { body: Body });
    expect(out.body).toEqual({ email: 'a@b.test' });
  });

  it('lists every bad field with its part of the request', () => {
    try {
      validate(req({ body: { email: 1, extra: true }, query: { x: '1' }, params: { id: 'nope' } }), {
        body: Body,
        params: z.strictObject({ id: z.uuid() }),
      });
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(BadRequest);
      const paths = ((err as BadRequest).details as { issues: { path: string }[] }).issues.map((i) => i.path);
      expect(paths).toEqual(expect.arrayContaining(['body.email', 'body', 'query', 'params.id']));
    }
  });

  it('routes without a body schema accept no body or {}, and nothing else', () => {
    expect(() => validate(req({}), {})).not.toThrow();
    expect(() => validate(req({ body: {} }), {})).not.toThrow();
    expect(() => validate(req({ body: { a: 1 } }), {})).toThrow(BadRequest);
    expect(() => validate(req({ body: [] }), {})).toThrow(BadRequest);
  });
});
