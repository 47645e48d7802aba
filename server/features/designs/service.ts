// Designs: the team's list, upload of a new design (parse first; nothing stored on failure; the
// design, its first revision and optional board in one transaction), and the detail page's data.
import { QueryTypes } from 'sequelize';
import type { Db } from '@/server/db';
import type { Design, User } from '@/server/db/models';
import { recordAudit } from '@/server/features/audit/service';
import { listAssumptions } from '@/server/features/assumptions/service';
import { listBoards } from '@/server/features/boards/service';
import { detectFamily, parseSource } from '@/server/features/designs/engine';
import { labelOf, userLabels } from '@/server/features/designs/users';
import { revisionDtos } from '@/server/features/revisions/dto';
import { scanDto } from '@/server/features/scans/dto';
import type { DesignDetail, DesignListItem, DesignUploadFields } from '@/shared/api/designs';

export async function listDesigns(db: Db, teamId: string): Promise<DesignListItem[]> {
  const rows = await db.sequelize.query<{
    id: string; name: string; family: DesignListItem['family']; updated_at: Date;
    rev_id: string; rev_number: number; part_counts: DesignListItem['latestRevision']['partCounts']; rev_created: Date;
    open_proposals: string; boards: string;
  }>(
    `SELECT d.id, d.name, d.family, d.updated_at, r.id AS rev_id, r.number AS rev_number, r.part_counts, r.created_at AS rev_created,
       (SELECT count(*) FROM proposals p WHERE p.design_id = d.id AND p.status = 'open') AS open_proposals,
       (SELECT count(*) FROM boards b WHERE b.design_id = d.id) AS boards
     FROM designs d
     JOIN LATERAL (SELECT id, number, part_counts, created_at FROM revisions WHERE design_id = d.id ORDER BY number DESC LIMIT 1) r ON true
     WHERE d.team_id = :teamId ORDER BY d.updated_at DESC, d.id`,
    { replacements: { teamId }, type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    family: r.family,
    latestRevision: { id: r.rev_id, number: r.rev_number, partCounts: r.part_counts, createdAt: new Date(r.rev_created).toISOString() },
    openProposals: Number(r.open_proposals),
    boards: Number(r.boards),
    updatedAt: new Date(r.updated_at).toISOString(),
  }));
}

export async function createDesign(db: Db, user: User, teamId: string, file: { buffer: Buffer; name: string }, fields: DesignUploadFields): Promise<Design> {
  // Parse before opening a transaction: a bad file is refused without touching the database.
  const parsed = parseSource(file.buffer, file.name, fields.format);
  const family = fields.family && fields.family !== 'detect' ? fields.family : detectFamily(parsed.flat);
  const design = await db.sequelize.transaction(async (transaction) => {
    const d = await db.models.Design.create({ teamId, name: fields.name, family, clockPeriodNs: fields.clockPeriodNs ?? null, createdBy: user.id }, { transaction });
    await db.models.Revision.create(
      { designId: d.id, number: 1, format: parsed.format, fileName: file.name, source: parsed.text, sha256: parsed.sha256, summary: parsed.summary, partCounts: parsed.partCounts, note: fields.note ?? null, createdBy: user.id },
      { transaction },
    );
    if (fields.boardName || fields.budgetParts !== undefined || fields.budgetAreaMm2 !== undefined || fields.budgetCost !== undefined) {
      const budget = {
        ...(fields.budgetParts !== undefined ? { parts: Math.round(fields.budgetParts) } : {}),
        ...(fields.budgetAreaMm2 !== undefined ? { areaMm2: fields.budgetAreaMm2 } : {}),
        ...(fields.budgetCost !== undefined ? { cost: fields.budgetCost } : {}),
      };
      await db.models.Board.create({ designId: d.id, name: fields.boardName ?? 'Main board', instances: [], budget }, { transaction });
    }
    await recordAudit(db, { teamId, actor: user, action: 'upload', target: fields.name, details: { designId: d.id, revision: 1, format: parsed.format, sha256: parsed.sha256 } }, transaction);
    return d;
  });
  return design;
}

export async function designDetail(db: Db, design: Design): Promise<DesignDetail> {
  // Independent reads in parallel: this is the most-read page.
  const [revisions, latestScan, latest, assumptions] = await Promise.all([
    db.models.Revision.findAll({ where: { designId: design.id }, order: [['number', 'ASC']], attributes: { exclude: ['source'] } }),
    db.models.Scan.findOne({ where: { designId: design.id }, order: [['createdAt', 'DESC']] }),
    db.models.Revision.findOne({ where: { designId: design.id }, order: [['number', 'DESC']] }),
    listAssumptions(db, design.id),
  ]);
  const [labels, boards] = await Promise.all([
    userLabels(db, [design.createdBy, latestScan?.startedBy, ...revisions.map((r) => r.createdBy)]),
    latest ? listBoards(db, design, latest) : Promise.resolve([]),
  ]);
  return {
    id: design.id,
    name: design.name,
    family: design.family,
    teamId: design.teamId,
    createdBy: labelOf(labels, design.createdBy),
    revisions: revisionDtos(revisions, labels),
    boards,
    assumptions,
    latestScan: latestScan ? scanDto(latestScan, labelOf(labels, latestScan.startedBy)) : null,
    ...(design.clockPeriodNs !== null ? { clockPeriodNs: design.clockPeriodNs } : {}),
  };
}
