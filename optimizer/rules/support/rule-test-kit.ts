// What rule tests share: running one rule (or the full scan) on a netlist with assumptions given
// as text or with ids, the savings property (applying a proposal changes part counts by exactly
// its stated savings), and reading a rule doc's fenced SPICE-style examples so they are tests.
import { readFileSync } from 'node:fs';
import { expect } from 'vitest';
import { partsOf, editSavings, type Savings } from '../../cost/cost';
import { extractLogic } from '../../extract';
import { readSpice } from '../../formats/spice/read';
import type { MapFamily } from '../../logic/family-parts';
import { marginSettings, type MarginSettings } from '../../margins/defaults';
import { parseExpr } from '../../logic/expr-parse';
import { flatten } from '../../netlist/flatten';
import type { FlatNetlist } from '../../netlist/ir';
import { applyProposals, flatToDesign } from '../../rewrite/apply';
import { writeSpice } from '../../formats/spice/write';
import { runRules, type RunResult } from '../run-rules';
import { scan, type ScanResult } from '../scan';
import type { Assumption, Proposal, Rule } from '../types';

/** An assumption with a chosen id. */
export function assumption(id: string, text: string): Assumption {
  return { id, text, expr: parseExpr(text) };
}

/** Assumptions from text (ids A1, A2 … by position) or given whole. */
export const assumptionsOf = (items: readonly (string | Assumption)[] = []): Assumption[] =>
  items.map((a, i) => (typeof a === 'string' ? assumption(`A${i + 1}`, a) : a));

export interface RunOne {
  assumptions?: (string | Assumption)[];
  options?: unknown;
  clockPeriod?: number;
  targetFamily?: MapFamily;
  /** Margin settings, or the fields that differ from the defaults. */
  margins?: Partial<MarginSettings>;
}

export function runOne(rule: Rule, nl: FlatNetlist, o: RunOne = {}): Promise<RunResult> {
  return runRules(nl, extractLogic(nl), {
    rules: { [rule.id]: rule },
    assumptions: assumptionsOf(o.assumptions),
    ...(o.options ? { ruleOptions: { [rule.id]: o.options } } : {}),
    ...(o.clockPeriod ? { clockPeriod: o.clockPeriod } : {}),
    ...(o.targetFamily ? { targetFamily: o.targetFamily } : {}),
    ...(o.margins ? { margins: marginSettings(o.margins) } : {}),
  });
}

export function scanOne(rule: Rule, nl: FlatNetlist, o: RunOne = {}): Promise<ScanResult> {
  return scan(nl, {
    rules: { [rule.id]: rule },
    assumptions: assumptionsOf(o.assumptions),
    ...(o.options ? { ruleOptions: { [rule.id]: o.options } } : {}),
    ...(o.clockPeriod ? { clockPeriod: o.clockPeriod } : {}),
    ...(o.targetFamily ? { targetFamily: o.targetFamily } : {}),
    ...(o.margins ? { margins: marginSettings(o.margins) } : {}),
  });
}

const DIFF_KEYS = ['transistors', 'resistors', 'diodes', 'capacitors', 'gates'] as const;

/** Stated savings of a proposal and the part counts the applied design really lost. */
export function savingsProperty(nl: FlatNetlist, p: Proposal, family: MapFamily = 'cmos'): { stated: Savings; actual: Record<string, number> } {
  const stated = editSavings(nl, p.edit, family);
  const before = partsOf(nl.devices, family);
  const after = partsOf(applyProposals(nl, [p]).devices, family);
  const actual = Object.fromEntries(DIFF_KEYS.map((k) => [k, before[k] - after[k]]));
  return { stated, actual };
}

/** Writes a flat netlist as a SPICE-style deck (one flat cell). */
export function deckOf(nl: FlatNetlist): string {
  return writeSpice(flatToDesign(nl));
}

/** The netlist after one proposal. */
export const applied = (nl: FlatNetlist, p: Proposal): FlatNetlist => applyProposals(nl, [p]);

/** Transistors, resistors and diodes lost by applying `p`, against the savings it states. */
export function countDelta(nl: FlatNetlist, p: Proposal): { actual: Record<string, number>; stated: Record<string, number> } {
  const { stated, actual } = savingsProperty(nl, p);
  const three = (x: Record<string, number>) => ({ transistors: x.transistors, resistors: x.resistors, diodes: x.diodes });
  return { actual: three(actual), stated: three(stated as unknown as Record<string, number>) };
}

export const pick = (s: Savings): Record<string, number> => Object.fromEntries(DIFF_KEYS.map((k) => [k, s[k]]));

export interface DocExample {
  /** From the fence's info string: ```spice name=… findings=… message=… */
  name: string;
  findings: number;
  message?: string;
  deck: string;
  assumptions: string[];
  clockPeriod?: number;
  verdict?: string;
}

const SUFFIX: Record<string, number> = { f: 1e-15, p: 1e-12, n: 1e-9, u: 1e-6, m: 1e-3, k: 1e3 };

/**
 * Examples in a rule's doc: fenced blocks whose info string starts with `spice`, carrying
 * `name=`, `findings=`, optional `message=` and `verdict=`. Inside the deck, comment cards
 * `* assume: EXPR` state assumptions and `* clock: 1u` a clock period (plain comments to a reader).
 */
export function docExamples(markdown: string): DocExample[] {
  const out: DocExample[] = [];
  const fence = /```spice([^\n]*)\n([\s\S]*?)```/g;
  for (let m = fence.exec(markdown); m; m = fence.exec(markdown)) {
    const attrs = Object.fromEntries([...m[1].matchAll(/(\w+)=(\S+)/g)].map((a) => [a[1], a[2]]));
    if (!attrs.name || attrs.findings === undefined) throw new Error(`doc example without name= and findings=: ${m[1]}`);
    const deck = m[2];
    const assumptions = [...deck.matchAll(/^\*\s*assume:\s*(.+)$/gim)].map((a) => a[1].trim());
    const clock = /^\*\s*clock:\s*([\d.]+)([fpnumk]?)s?\s*$/im.exec(deck);
    out.push({
      name: attrs.name,
      findings: Number(attrs.findings),
      ...(attrs.message ? { message: attrs.message } : {}),
      ...(attrs.verdict ? { verdict: attrs.verdict } : {}),
      deck,
      assumptions,
      ...(clock ? { clockPeriod: Number(clock[1]) * (SUFFIX[clock[2]] ?? 1) } : {}),
    });
  }
  return out;
}

/** A SPICE-style deck as a flat netlist (reader errors fail the example loudly). */
export function deckNetlist(deck: string, file = 'example.cir'): FlatNetlist {
  const { design, diagnostics } = readSpice(deck, file);
  const errors = diagnostics.filter((d) => d.severity === 'error');
  if (errors.length) throw new Error(`${file}: ${errors.map((e) => e.message).join('; ')}`);
  return flatten(design);
}

export interface DeckExample {
  /** The deck's title line, as a label. */
  label: string;
  deck: string;
  /** From `* expect: none` or `* expect: <messageId> key=value …`. */
  expect: { messageId: string | null; data: Record<string, string> };
  /** `* assume: ID EXPR` lines. */
  assumptions: Assumption[];
  /** `* options: {json}` — the rule's options for this example. */
  options?: Record<string, unknown>;
}

/**
 * Examples in a rule doc written with plain ```spice fences whose deck states what it expects in
 * comment cards: `* expect: none` or `* expect: <messageId> key=value …`, `* assume: ID EXPR`.
 */
export function deckExamples(mdPath: string): DeckExample[] {
  const md = readFileSync(mdPath, 'utf8');
  const out: DeckExample[] = [];
  for (const m of md.matchAll(/```spice\n([\s\S]*?)```/g)) {
    const deck = m[1];
    const expectLine = /^\*\s*expect:\s*(.+)$/m.exec(deck);
    if (!expectLine) {
      const line = md.slice(0, m.index ?? 0).split('\n').length;
      throw new Error(`${mdPath}:${line}: the spice example "${deck.split('\n')[0].trim()}" lacks a "* expect: none" or "* expect: <messageId> key=value …" line`);
    }
    const [head, ...pairs] = expectLine[1].trim().split(/\s+/);
    const data = Object.fromEntries(pairs.map((p) => p.split('=') as [string, string]));
    const assumptions = [...deck.matchAll(/^\*\s*assume:\s*(\S+)\s+(.+)$/gm)].map((a) => assumption(a[1], a[2].trim()));
    const options = /^\*\s*options:\s*(\{.*\})\s*$/m.exec(deck);
    out.push({ label: deck.split('\n')[0].trim(), deck, expect: { messageId: head === 'none' ? null : head, data }, assumptions, ...(options ? { options: JSON.parse(options[1]) } : {}) });
  }
  return out;
}

/**
 * Runs one deck example through `rule` and checks what its `* expect:` line says: no finding, or
 * one finding with that message id and data, whose proposal changes part counts by its savings.
 */
export async function checkDeckExample(rule: Rule, ex: DeckExample): Promise<void> {
  const nl = deckNetlist(ex.deck);
  const r = await runOne(rule, nl, { assumptions: ex.assumptions, ...(ex.options ? { options: ex.options } : {}) });
  expect(r.ruleErrors).toEqual([]);
  if (ex.expect.messageId === null) {
    expect(r.findings).toEqual([]);
    return;
  }
  expect(r.findings.map((f) => f.messageId)).toEqual([ex.expect.messageId]);
  for (const [k, v] of Object.entries(ex.expect.data)) expect(String(r.findings[0].data[k])).toBe(v);
  const d = countDelta(nl, r.findings[0].proposals[0]);
  expect(d.actual).toEqual(d.stated);
}
