// New revisions: an upload of a new source, or the accepted, non-overlapping proposals of the
// latest revision applied by the engine and written back in the revision's format. Either is one
// transaction under a lock on the design row, so two applies cannot both build on one revision;
// every refusal (revision moved on, proposals not accepted, overlapping) is a 409 and writes nothing.
import { Op, type Transaction } from 'sequelize';
import { InputError, writeDesign } from '@/optimizer';
import { applyProposals, flatToDesign } from '@/optimizer/rewrite/apply';
import type { Proposal as EngineProposal } from '@/optimizer/rules/types';
import type { Db } from '@/server/db';
import type { Design, Revision, User } from '@/server/db/models';
import { Conflict } from '@/server/http/errors';
import { recordAudit } from '@/server/features/audit/service';
import { loadRevision, parseSource } from '@/server/features/designs/engine';
import type { ApplyBody } from '@/shared/api/revisions';

async function lockDesign(db: Db, design: Design, transaction: Transaction): Promise<Revision> {
  await db.models.Design.findByPk(design.id, { transaction, lock: transaction.LOCK.UPDATE });
  const latest = await db.models.Revision.findOne({ where: { designId: design.id }, order: [['number', 'DESC']], transaction });
  if (!latest) throw new Conflict('The design has no revision to build on.');
  return latest;
}

export async function uploadRevision(db: Db, design: Design, user: User, file: { buffer: Buffer; name: string }, fields: { format?: 'spice' | 'verilog' | 'json'; note?: string }): Promise<Revision> {
  const parsed = parseSource(file.buffer, file.name, fields.format);
  return db.sequelize.transaction(async (transaction) => {
    const latest = await lockDesign(db, design, transaction);
    const rev = await db.models.Revision.create(
      { designId: design.id, number: latest.number + 1, format: parsed.format, fileName: file.name, source: parsed.text, sha256: parsed.sha256, summary: parsed.summary, partCounts: parsed.partCounts, note: fields.note ?? null, createdBy: user.id },
      { transaction },
    );
    // Proposals of earlier revisions no longer describe the design.
    await db.models.Proposal.update({ status: 'out-of-date' }, { where: { designId: design.id, status: { [Op.in]: ['open', 'accepted'] } }, transaction });
    await db.sequelize.query('UPDATE designs SET updated_at = now() WHERE id = :id', { replacements: { id: design.id }, transaction });
    await recordAudit(db, { teamId: design.teamId, actor: user, action: 'upload', target: design.name, details: { designId: design.id, revision: rev.number, sha256: parsed.sha256 } }, transaction);
    return rev;
  });
}

export async function applyAccepted(db: Db, design: Design, user: User, body: ApplyBody): Promise<Revision> {
  return db.sequelize.transaction(async (transaction) => {
    const latest = await lockDesign(db, design, transaction);
    if (body.baseRevision !== latest.number) {
      throw new Conflict(`Revision ${body.baseRevision} is no longer the latest (revision ${latest.number} is). Review the proposals of revision ${latest.number} and apply again.`, 'revision-moved', { latest: latest.number });
    }
    const ids = [...new Set(body.applyProposalIds)];
    const rows = await db.models.Proposal.findAll({ where: { id: { [Op.in]: ids }, designId: design.id }, transaction, lock: transaction.LOCK.UPDATE });
    const missing = ids.filter((id) => !rows.some((r) => r.id === id));
    if (missing.length) throw new Conflict(`${missing.length} of the proposals are not proposals of this design.`, 'not-accepted', { proposals: missing.map((id) => ({ id, status: 'unknown' })) });
    const notReady = rows.filter((r) => r.status !== 'accepted' || r.revisionId !== latest.id);
    if (notReady.length) {
      throw new Conflict(
        `Only accepted proposals of revision ${latest.number} can be applied; ${notReady.map((r) => `“${r.title}” is ${r.revisionId !== latest.id ? `from revision ${r.revisionNumber}` : r.status}`).slice(0, 5).join('; ')}.`,
        'not-accepted',
        { proposals: notReady.map((r) => ({ id: r.id, status: r.status, revision: r.revisionNumber })) },
      );
    }
    const chosen = new Set(ids);
    const pairs: { a: string; b: string }[] = [];
    for (const r of rows) for (const o of r.overlapsWith ?? []) if (chosen.has(o) && r.id < o) pairs.push({ a: r.id, b: o });
    if (pairs.length) {
      throw new Conflict(`${pairs.length} pair(s) of the chosen proposals change the same parts; apply one of each pair, then scan again.`, 'proposals-overlap', { pairs });
    }
    const { flat } = loadRevision(latest);
    const engineProposals: EngineProposal[] = rows.map((r) => ({ id: r.engineId, title: r.title, edit: r.edit, assumptions: [], margins: [] }));
    let text: string;
    try {
      const after = applyProposals(flat, engineProposals);
      text = writeDesign(flatToDesign(after, latest.format), latest.format);
    } catch (err) {
      if (err instanceof InputError && err.diagnostics.some((d) => d.code === 'apply.overlap')) {
        throw new Conflict(err.message, 'proposals-overlap', { pairs: [], messages: err.diagnostics.map((d) => d.message) });
      }
      if (err instanceof InputError) throw new Conflict(`The proposals no longer fit the revision: ${err.message}`, 'not-accepted');
      throw err;
    }
    const fileName = latest.fileName.replace(/(\.[A-Za-z0-9]+)?$/, '') + `-r${latest.number + 1}.${latest.format === 'spice' ? 'cir' : latest.format === 'verilog' ? 'v' : latest.format}`;
    const parsed = parseSource(text, fileName, latest.format);
    const rev = await db.models.Revision.create(
      {
        designId: design.id,
        number: latest.number + 1,
        format: parsed.format,
        fileName,
        source: parsed.text,
        sha256: parsed.sha256,
        summary: parsed.summary,
        partCounts: parsed.partCounts,
        note: body.note ?? `Applied ${rows.length} accepted proposal${rows.length === 1 ? '' : 's'} to revision ${latest.number}.`,
        appliedProposals: rows.map((r) => r.id),
        createdBy: user.id,
      },
      { transaction },
    );
    await db.models.Proposal.update({ status: 'applied' }, { where: { id: { [Op.in]: ids } }, transaction });
    await db.models.Proposal.update({ status: 'out-of-date' }, { where: { designId: design.id, status: { [Op.in]: ['open', 'accepted'] } }, transaction });
    await db.sequelize.query('UPDATE designs SET updated_at = now() WHERE id = :id', { replacements: { id: design.id }, transaction });
    await recordAudit(db, { teamId: design.teamId, actor: user, action: 'apply', target: design.name, details: { designId: design.id, from: latest.number, revision: rev.number, proposals: ids } }, transaction);
    return rev;
  });
}
