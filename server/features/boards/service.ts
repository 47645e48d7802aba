// Boards of a design: list with usage against budget, create, change. A change re-files the
// design's proposals onto the boards they touch (the board filter reads that).
import type { Transaction } from 'sequelize';
import type { Db } from '@/server/db';
import type { Board as BoardRow, Design, Revision } from '@/server/db/models';
import { NotFound } from '@/server/http/errors';
import { loadRevision } from '@/server/features/designs/engine';
import { boardsTouched, boardUsage } from '@/server/features/boards/usage';
import { DEFAULT_PARTS_TABLE } from '@/optimizer/cost/parts-table';
import type { Board, BoardBody, BoardPatchBody } from '@/shared/api/boards';

export async function latestRevision(db: Db, designId: string, transaction?: Transaction): Promise<Revision> {
  const rev = await db.models.Revision.findOne({ where: { designId }, order: [['number', 'DESC']], transaction });
  if (!rev) throw new NotFound('The design has no revision.');
  return rev;
}

export async function listBoards(db: Db, design: Design, rev?: Revision): Promise<Board[]> {
  const boards = await db.models.Board.findAll({ where: { designId: design.id }, order: [['createdAt', 'ASC']] });
  if (!boards.length) return [];
  const latest = rev ?? (await latestRevision(db, design.id));
  const { flat } = loadRevision(latest);
  const accepted = await db.models.Proposal.findAll({ where: { designId: design.id, revisionId: latest.id, status: 'accepted' }, attributes: ['edit'] });
  const edits = accepted.map((p) => p.edit);
  return boards.map((b) => ({
    id: b.id,
    name: b.name,
    instances: b.instances,
    budget: b.budget,
    usage: boardUsage(flat, b.instances, design.family, edits),
    currency: DEFAULT_PARTS_TABLE.currency,
  }));
}

/** Device instance paths a proposal touches (removed and reconnected devices, added ones' paths). */
export function proposalPaths(edit: { removeDevices: string[]; reconnect: { device: string }[]; addDevices: { path?: string[] }[] }, pathByName: Map<string, string>): string[] {
  const out = [...edit.removeDevices, ...edit.reconnect.map((r) => r.device)].map((n) => pathByName.get(n)).filter((p): p is string => p !== undefined);
  for (const d of edit.addDevices) if (d.path?.length) out.push(d.path.join('.'));
  return out;
}

export async function refileProposals(db: Db, design: Design, transaction?: Transaction): Promise<void> {
  const boards = await db.models.Board.findAll({ where: { designId: design.id }, transaction });
  const proposals = await db.models.Proposal.findAll({ where: { designId: design.id }, attributes: ['id', 'revisionId', 'edit', 'boardIds'], transaction });
  const revs = new Map<string, Map<string, string>>();
  for (const p of proposals) {
    let paths = revs.get(p.revisionId);
    if (!paths) {
      const rev = await db.models.Revision.findByPk(p.revisionId, { transaction });
      if (!rev) continue;
      paths = new Map(loadRevision(rev).flat.devices.map((d) => [d.name, d.path.join('.')]));
      revs.set(p.revisionId, paths);
    }
    const ids = boardsTouched(boards, proposalPaths(p.edit, paths));
    if (ids.join() !== (p.boardIds ?? []).join()) await p.update({ boardIds: ids }, { transaction });
  }
}

export async function createBoard(db: Db, design: Design, body: BoardBody): Promise<Board> {
  const row = await db.sequelize.transaction(async (transaction) => {
    const b = await db.models.Board.create({ designId: design.id, name: body.name, instances: body.instances, budget: body.budget }, { transaction });
    await refileProposals(db, design, transaction);
    return b;
  });
  return (await listBoards(db, design)).find((b) => b.id === row.id)!;
}

export async function patchBoard(db: Db, design: Design, boardId: string, patch: BoardPatchBody): Promise<Board> {
  await db.sequelize.transaction(async (transaction) => {
    const b: BoardRow | null = await db.models.Board.findOne({ where: { id: boardId, designId: design.id }, transaction });
    if (!b) throw new NotFound('No such board.');
    await b.update({ ...(patch.name !== undefined ? { name: patch.name } : {}), ...(patch.instances ? { instances: patch.instances } : {}), ...(patch.budget ? { budget: patch.budget } : {}) }, { transaction });
    if (patch.instances) await refileProposals(db, design, transaction);
  });
  return (await listBoards(db, design)).find((b) => b.id === boardId)!;
}

