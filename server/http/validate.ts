// Parses request parts with zod schemas; handlers use only the parsed values. A failure becomes a
// 400 with one entry per bad field.
import type { Request } from 'express';
import { z } from 'zod';
import { BadRequest } from '@/server/http/errors';
import type { FieldIssue } from '@/shared/api/error';

const EmptySchema = z.strictObject({});
/** A body that is absent or `{}` (routes that take no input still refuse unexpected fields). */
const NoBodySchema = z.union([z.undefined(), EmptySchema]);

type Schemas = { body?: z.ZodType; query?: z.ZodType; params?: z.ZodType };
type Parsed<S extends Schemas> = {
  body: S['body'] extends z.ZodType ? z.output<S['body']> : undefined;
  query: S['query'] extends z.ZodType ? z.output<S['query']> : Record<string, never>;
  params: S['params'] extends z.ZodType ? z.output<S['params']> : Record<string, never>;
};

export function issuesOf(error: z.ZodError, prefix: string): FieldIssue[] {
  return error.issues.map((i) => ({
    path: [prefix, ...i.path.map(String)].join('.'),
    message: i.message,
  }));
}

/** Validates body, query and params; parts without a schema must be empty. */
export function validate<S extends Schemas>(req: Request, schemas: S): Parsed<S> {
  const issues: FieldIssue[] = [];
  const run = (schema: z.ZodType, value: unknown, part: string): unknown => {
    const r = schema.safeParse(value);
    if (r.success) return r.data;
    issues.push(...issuesOf(r.error, part));
    return undefined;
  };
  const body = run(schemas.body ?? NoBodySchema, req.body, 'body');
  // Express 5 gives query as a plain object; copy it so zod sees own properties only.
  const query = run(schemas.query ?? EmptySchema, { ...(req.query as object) }, 'query');
  const params = run(schemas.params ?? EmptySchema, { ...req.params }, 'params');
  if (issues.length > 0) {
    throw new BadRequest(`Check ${issues.map((i) => i.path).join(', ')}.`, { issues });
  }
  return { body, query, params } as Parsed<S>;
}
