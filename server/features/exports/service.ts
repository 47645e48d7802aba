// Exports of a stored revision: SPICE-style deck, structural Verilog (the gate-level view the
// extractor sees), JSON, bill of materials and the review report. Formats the engine cannot write
// for a design (a SPICE deck of gate primitives) are refused with 400 "export-unsupported".
import { InputError, writeSpice, writeJson, writeVerilog } from '@/optimizer';
import { extractLogic } from '@/optimizer/extract';
import { toGateLevel } from '@/optimizer/extract/gate-level';
import type { Db } from '@/server/db';
import type { Design, Revision } from '@/server/db/models';
import { BadRequest } from '@/server/http/errors';
import { loadRevision } from '@/server/features/designs/engine';
import { userLabels } from '@/server/features/designs/users';
import { proposalDetail } from '@/server/features/proposals/service';
import { revisionDtos } from '@/server/features/revisions/dto';
import { bomCsv } from '@/server/features/exports/bom';
import { reportHtml, reportMarkdown } from '@/server/features/exports/report';
import type { ExportFormat } from '@/shared/api/revisions';

export type ExportFile = { body: string; contentType: string; fileName: string };

const safeName = (s: string) => s.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 80) || 'design';

function engineWrite<T>(what: string, fn: () => T): T {
  try {
    return fn();
  } catch (err) {
    if (err instanceof InputError) throw new BadRequest(`This revision cannot be exported as ${what}: ${err.message}`, undefined, 'export-unsupported');
    throw err;
  }
}

export async function exportRevision(db: Db, design: Design, rev: Revision, format: ExportFormat): Promise<ExportFile> {
  const base = `${safeName(design.name)}-r${rev.number}`;
  const { design: parsed, flat } = loadRevision(rev);
  switch (format) {
    case 'spice':
      return { body: engineWrite('a SPICE-style deck', () => writeSpice(parsed)), contentType: 'application/x-spice; charset=utf-8', fileName: `${base}.cir` };
    case 'verilog':
      return { body: engineWrite('Verilog', () => writeVerilog(parsed.format === 'verilog' ? parsed : toGateLevel(extractLogic(flat)))), contentType: 'text/x-verilog; charset=utf-8', fileName: `${base}.v` };
    case 'json':
      return { body: writeJson(parsed), contentType: 'application/json; charset=utf-8', fileName: `${base}.json` };
    case 'bom':
      return { body: bomCsv(flat), contentType: 'text/csv; charset=utf-8', fileName: `${base}-bom.csv` };
    case 'report':
    case 'report-html': {
      const rows = await db.models.Proposal.findAll({ where: { designId: design.id, revisionId: rev.id }, order: [['savingsParts', 'DESC'], ['id', 'ASC']] });
      const proposals = await Promise.all(rows.map((p) => proposalDetail(db, p)));
      const all = await db.models.Revision.findAll({ where: { designId: design.id }, attributes: { exclude: ['source'] } });
      const dto = revisionDtos(all, await userLabels(db, all.map((r) => r.createdBy))).find((r) => r.id === rev.id)!;
      const input = { designName: design.name, family: design.family, revision: dto, proposals, generatedAt: new Date() };
      return format === 'report'
        ? { body: reportMarkdown(input), contentType: 'text/markdown; charset=utf-8', fileName: `${base}-report.md` }
        : { body: reportHtml(input), contentType: 'text/html; charset=utf-8', fileName: `${base}-report.html` };
    }
  }
}
