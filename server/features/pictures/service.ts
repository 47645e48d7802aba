// Pictures of stored proposals and designs: the changed region before and after, its before/after
// switch-level simulation with the default or an edited stimulus, and a whole-design or one-
// subcircuit graph. Engine work runs on the cached parsed revision.
import { InputError } from '@/optimizer/errors';
import { parseExpr } from '@/optimizer/logic/expr-parse';
import { applyProposals } from '@/optimizer/rewrite/apply';
import { designGraph, subcircuitGraph, type RegionGraph } from '@/optimizer/region/graph';
import { extractRegion, type Region } from '@/optimizer/region/region';
import { simulateRegion } from '@/optimizer/region/simulate';
import { defaultStimulus, parseStimulusText, regionInputs, stimulusProblems, stimulusToText } from '@/optimizer/region/stimulus';
import type { Assumption, Edit } from '@/optimizer/rules/types';
import type { FlatNetlist } from '@/optimizer/netlist/ir';
import type { Db } from '@/server/db';
import type { Design, Proposal } from '@/server/db/models';
import { loadRevision, toUploadDiagnostic } from '@/server/features/designs/engine';
import { BadRequest, NotFound } from '@/server/http/errors';
import type { DesignDrawing, ProposalRegion, RegionSimulation } from '@/shared/api/pictures';

/** Larger designs are simulated by scans (in workers), not on a request. */
export const MAX_SIMULATED_DEVICES = 20_000;
/** A whole-design drawing beyond this many parts is unreadable: pick a subcircuit. */
export const MAX_DRAWN_PARTS = 600;

type Prepared = { before: FlatNetlist; after: FlatNetlist; region: Region; assumptions: { id: string; expression: string }[]; parsed: Assumption[] };

async function prepare(db: Db, p: Proposal): Promise<Prepared> {
  const rev = await db.models.Revision.findByPk(p.revisionId);
  if (!rev) throw new NotFound('The revision of this proposal no longer exists.');
  const { flat } = loadRevision(rev);
  const edit = p.edit as Edit;
  let after: FlatNetlist;
  try {
    after = applyProposals(flat, [{ id: p.engineId, title: p.title, edit, assumptions: [], margins: [] }]);
  } catch (err) {
    if (err instanceof InputError) throw new BadRequest(`This proposal no longer fits its revision: ${err.diagnostics[0]?.message ?? 'bad edit'}`);
    throw err;
  }
  const rows = await db.models.Assumption.findAll({ where: { designId: p.designId, status: 'active' }, order: [['createdAt', 'ASC']] });
  const parsed: Assumption[] = [];
  for (const a of rows) {
    try {
      parsed.push({ id: a.id, text: a.expression, expr: parseExpr(a.expression) });
    } catch {
      // Stored assumptions were validated on write; one the parser now refuses limits nothing here.
    }
  }
  return { before: flat, after, region: extractRegion(flat, edit, after), assumptions: rows.map((a) => ({ id: a.id, expression: a.expression })), parsed };
}

export async function proposalRegion(db: Db, p: Proposal): Promise<ProposalRegion> {
  const { before, region, assumptions, parsed } = await prepare(db, p);
  const inputs = regionInputs(before, region.before);
  return {
    proposalId: p.id,
    ruleId: p.ruleId,
    before: region.before,
    after: region.after,
    removed: region.removed,
    added: region.added,
    reconnected: region.reconnected,
    ringTruncated: region.ringTruncated,
    inputs,
    stimulus: stimulusToText(defaultStimulus(inputs, parsed)),
    assumptions,
  };
}

export async function simulateProposal(db: Db, p: Proposal, text?: string): Promise<RegionSimulation> {
  const { before, after, region, parsed } = await prepare(db, p);
  if (before.devices.length > MAX_SIMULATED_DEVICES) {
    throw new BadRequest(`This design has ${before.devices.length} parts; waveforms are drawn for designs up to ${MAX_SIMULATED_DEVICES}.`);
  }
  let stimulus;
  try {
    stimulus = text === undefined ? defaultStimulus(regionInputs(before, region.before), parsed) : parseStimulusText(text);
  } catch (err) {
    if (err instanceof InputError) {
      const d = err.diagnostics[0];
      throw new BadRequest(`The stimulus could not be read: ${d.loc ? `line ${d.loc.line}, column ${d.loc.col}: ` : ''}${d.message}`, { diagnostics: err.diagnostics.map(toUploadDiagnostic) }, 'parse-error');
    }
    throw err;
  }
  const problems = stimulusProblems(stimulus, parsed);
  if (problems.length) throw new BadRequest(`The stimulus breaks the design's assumptions: ${problems.slice(0, 3).join('; ')}.`, { problems });
  const unknown = [...new Set(stimulus.vectors.flatMap((v) => Object.keys(v)))].filter((n) => !before.netByName.has(n) && !after.netByName.has(n));
  if (stimulus.kind === 'clocked' && !before.netByName.has(stimulus.clock)) unknown.push(stimulus.clock);
  if (unknown.length) throw new BadRequest(`The stimulus names nets the design does not have: ${unknown.slice(0, 5).join(', ')}.`, { nets: unknown });
  const sim = simulateRegion(before, after, region, stimulus);
  return { ...sim, stimulus: stimulusToText(stimulus) };
}

export async function designDrawing(db: Db, design: Design, q: { revision?: number; instance?: string }): Promise<DesignDrawing> {
  const rev = await db.models.Revision.findOne({ where: { designId: design.id, ...(q.revision ? { number: q.revision } : {}) }, order: [['number', 'DESC']] });
  if (!rev) throw new NotFound('No such revision.');
  const { flat } = loadRevision(rev);
  let graph: RegionGraph;
  if (q.instance) {
    graph = subcircuitGraph(flat, q.instance);
    if (graph.parts.length === 0) throw new NotFound(`No subcircuit instance ${q.instance} in revision ${rev.number}.`);
  } else graph = designGraph(flat);
  if (graph.parts.length > MAX_DRAWN_PARTS) {
    throw new BadRequest(`${graph.parts.length} parts are too many to draw at once (up to ${MAX_DRAWN_PARTS}); choose one subcircuit instance.`, { parts: graph.parts.length });
  }
  return { revision: rev.number, instance: q.instance ?? null, graph };
}
