// Assumptions of a design: checked by the engine's expression parser (and against the latest
// revision's net names), owned by whoever states them. Editing or withdrawing one puts every open
// or accepted proposal that relied on it out of date.
import { Op, type Transaction } from 'sequelize';
import { InputError } from '@/optimizer';
import { parseExpr } from '@/optimizer/logic/expr-parse';
import { support } from '@/optimizer/logic/expr';
import type { Db } from '@/server/db';
import type { Assumption as AssumptionRow, Design, User } from '@/server/db/models';
import { BadRequest, NotFound } from '@/server/http/errors';
import { loadRevision } from '@/server/features/designs/engine';
import { latestRevision } from '@/server/features/boards/service';
import { labelOf, userLabels } from '@/server/features/designs/users';
import type { Assumption, AssumptionBody, AssumptionPatchBody } from '@/shared/api/assumptions';

/** Parses an expression; 400 "assumption-parse" with line, column and the parser's message. */
export async function checkExpression(db: Db, design: Design, expression: string): Promise<void> {
  let names: Set<string>;
  try {
    names = support(parseExpr(expression, 'assumption'));
  } catch (err) {
    if (!(err instanceof InputError)) throw err;
    const d = err.diagnostics[0];
    throw new BadRequest(`The assumption does not parse: column ${d?.loc?.col ?? 1}: ${d?.message ?? 'invalid expression'}`, {
      line: d?.loc?.line ?? 1,
      column: d?.loc?.col ?? 1,
      diagnostics: err.diagnostics.map((x) => ({ severity: x.severity, code: x.code, message: x.message, line: x.loc?.line ?? null, col: x.loc?.col ?? null, file: null })),
    }, 'assumption-parse');
  }
  const { flat } = loadRevision(await latestRevision(db, design.id));
  const unknown = [...names].filter((n) => !flat.netByName.has(n));
  if (unknown.length) {
    const col = Math.max(1, expression.indexOf(unknown[0]!) + 1);
    throw new BadRequest(`The assumption names net${unknown.length > 1 ? 's' : ''} the design does not have: ${unknown.slice(0, 5).join(', ')}.`, {
      line: 1,
      column: col,
      unknownNets: unknown,
    }, 'assumption-parse');
  }
}

export function assumptionDto(a: AssumptionRow, labels: Map<string, string>): Assumption {
  return {
    id: a.id,
    expression: a.expression,
    owner: labelOf(labels, a.ownerId),
    ownerId: a.ownerId,
    justification: a.justification,
    status: a.status,
    createdAt: a.createdAt.toISOString(),
    updatedAt: a.updatedAt.toISOString(),
  };
}

export async function listAssumptions(db: Db, designId: string): Promise<Assumption[]> {
  const rows = await db.models.Assumption.findAll({ where: { designId }, order: [['createdAt', 'ASC']] });
  const labels = await userLabels(db, rows.map((r) => r.ownerId));
  return rows.map((r) => assumptionDto(r, labels));
}

export async function createAssumption(db: Db, design: Design, owner: User, body: AssumptionBody): Promise<Assumption> {
  await checkExpression(db, design, body.expression);
  const row = await db.models.Assumption.create({ designId: design.id, expression: body.expression, justification: body.justification, ownerId: owner.id });
  return assumptionDto(row, await userLabels(db, [row.ownerId]));
}

/** Puts every open or accepted proposal that relied on the assumption out of date. */
export async function outdateDependents(db: Db, assumptionId: string, transaction: Transaction): Promise<number> {
  const [n] = await db.models.Proposal.update(
    { status: 'out-of-date' },
    { where: { assumptionIds: { [Op.contains]: [assumptionId] }, status: { [Op.in]: ['open', 'accepted'] } }, transaction },
  );
  return n;
}

async function findOwn(db: Db, design: Design, aid: string, transaction: Transaction): Promise<AssumptionRow> {
  const row = await db.models.Assumption.findOne({ where: { id: aid, designId: design.id }, transaction, lock: transaction.LOCK.UPDATE });
  if (!row) throw new NotFound('No such assumption.');
  return row;
}

export async function patchAssumption(db: Db, design: Design, aid: string, patch: AssumptionPatchBody): Promise<Assumption> {
  if (patch.expression !== undefined) await checkExpression(db, design, patch.expression);
  const row = await db.sequelize.transaction(async (transaction) => {
    const a = await findOwn(db, design, aid, transaction);
    const changesMeaning = (patch.expression !== undefined && patch.expression !== a.expression) || (patch.status !== undefined && patch.status !== a.status);
    await a.update({ ...patch }, { transaction });
    if (changesMeaning) await outdateDependents(db, a.id, transaction);
    return a;
  });
  return assumptionDto(row, await userLabels(db, [row.ownerId]));
}

/** Deleting is withdrawing for good: the row stays (proposals cite it) with status withdrawn. */
export async function withdrawAssumption(db: Db, design: Design, aid: string): Promise<void> {
  await db.sequelize.transaction(async (transaction) => {
    const a = await findOwn(db, design, aid, transaction);
    if (a.status !== 'withdrawn') await a.update({ status: 'withdrawn' }, { transaction });
    await outdateDependents(db, a.id, transaction);
  });
}
