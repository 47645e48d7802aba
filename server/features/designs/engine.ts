// The server's bridge to the engine for stored sources: parse an upload into a summary and part
// counts (located diagnostics on failure), detect the logic family, and keep a small cache of
// parsed and flattened revisions so reads never re-parse the same source twice.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { countParts, flatten, InputError, readDesign, type Diagnostic } from '@/optimizer';
import type { Design, FlatNetlist, Format } from '@/optimizer/netlist/ir';
import { stableHash } from '@/optimizer/rules/run-rules';
import { RULES } from '@/optimizer/rules';
import { BadRequest } from '@/server/http/errors';
import type { RevisionSummary } from '@/server/db/models/revision';
import type { DesignFamily, UploadDiagnostic } from '@/shared/api/designs';
import type { PartCounts } from '@/shared/api/revisions';

const VERSION = (JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../../package.json'), 'utf8')) as { version: string }).version;
/** Package version plus a hash of the rule catalogue: two scans with the same value ran the same rules. */
export const ENGINE_VERSION = `${VERSION}+rules.${stableHash(Object.keys(RULES).sort().join(','))}`;

export type ParsedSource = {
  design: Design;
  flat: FlatNetlist;
  format: Format;
  text: string;
  sha256: string;
  partCounts: PartCounts;
  summary: RevisionSummary;
};

export function toUploadDiagnostic(d: Diagnostic): UploadDiagnostic {
  return { severity: d.severity, code: d.code, message: d.message, line: d.loc?.line ?? null, col: d.loc?.col ?? null, file: d.loc?.file ?? null };
}

export function parseErrorOf(diagnostics: Diagnostic[]): BadRequest {
  const list = diagnostics.map(toUploadDiagnostic);
  const first = list.find((d) => d.severity === 'error') ?? list[0];
  const where = first?.line ? `${first.file ?? 'file'}:${first.line}:${first.col ?? 1}: ` : '';
  return new BadRequest(`The file could not be read: ${where}${first?.message ?? 'invalid input'}`, { diagnostics: list }, 'parse-error');
}

/** Parses, flattens and counts a source; an InputError becomes 400 "parse-error" with diagnostics. */
export function parseSource(input: Buffer | string, fileName: string, format?: Format): ParsedSource {
  try {
    const { design, diagnostics } = readDesign(input, { file: fileName, format });
    if (diagnostics.some((d) => d.severity === 'error')) throw parseErrorOf(diagnostics);
    const flat = flatten(design);
    const c = countParts(design, 0);
    const text = typeof input === 'string' ? input : input.toString('utf8');
    const top = design.cells[design.top];
    return {
      design,
      flat,
      format: design.format,
      text,
      sha256: crypto.createHash('sha256').update(text).digest('hex'),
      partCounts: { transistors: c.transistors, resistors: c.resistors, diodes: c.diodes, capacitors: c.capacitors, gates: c.gates, total: c.transistors + c.resistors + c.diodes + c.capacitors + c.gates },
      summary: {
        title: design.title,
        top: design.top,
        cells: Object.keys(design.cells).length,
        instances: flat.devices.reduce((n, d) => Math.max(n, d.path.length), 0) > 0 ? countInstances(flat) : 0,
        nets: flat.nets.length,
        devices: flat.devices.length,
        topInstances: (top?.instances ?? []).map((i) => i.name).slice(0, 500),
        warnings: diagnostics.filter((d) => d.severity === 'warning').slice(0, 50).map((d) => ({ code: d.code, message: d.message, line: d.loc?.line ?? null, col: d.loc?.col ?? null })),
      },
    };
  } catch (err) {
    if (err instanceof InputError) throw parseErrorOf(err.diagnostics);
    throw err;
  }
}

function countInstances(flat: FlatNetlist): number {
  const paths = new Set<string>();
  for (const d of flat.devices) for (let k = 1; k <= d.path.length; k++) paths.add(d.path.slice(0, k).join('.'));
  return paths.size;
}

/** The family a design is built in, from its parts: gates → gate, PMOS → CMOS, NMOS only → NMOS, diodes with bipolar → DTL, else RTL. */
export function detectFamily(flat: FlatNetlist): DesignFamily {
  const kinds = new Set(flat.devices.map((d) => d.kind));
  if (kinds.has('gate')) return 'gate';
  if (kinds.has('pmos')) return 'cmos';
  if (kinds.has('nmos')) return 'nmos';
  if ((kinds.has('npn') || kinds.has('pnp')) && kinds.has('diode')) return 'dtl';
  if (kinds.has('npn') || kinds.has('pnp')) return 'rtl';
  return 'cmos';
}

export function totalOf(c: PartCounts): number {
  return c.transistors + c.resistors + c.diodes + c.capacitors + c.gates;
}

type CachedRevision = { design: Design; flat: FlatNetlist };
const CACHE_SIZE = 16;
const cache = new Map<string, CachedRevision>();

/** A stored revision parsed and flattened (sources in the database were valid when stored). */
export function loadRevision(rev: { id: string; source: string; fileName: string; format: Format }): CachedRevision {
  const hit = cache.get(rev.id);
  if (hit) {
    cache.delete(rev.id);
    cache.set(rev.id, hit);
    return hit;
  }
  const { design } = readDesign(rev.source, { file: rev.fileName, format: rev.format });
  const entry = { design, flat: flatten(design) };
  cache.set(rev.id, entry);
  if (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value as string);
  return entry;
}
