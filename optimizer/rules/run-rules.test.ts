// Proves the rule framework: messages by id, options through the schema, frozen inputs, crashing
// and contract-breaking rules recorded as rule errors, stable ids and the overlap graph.
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { InputError, InternalError } from '../errors';
import { defineRule, renderMessage } from './define-rule';
import { overlapOf, touched } from '../rewrite/edits';
import { overlapGraph, runRules, stableHash, type OverlapGraph } from './run-rules';
import { emptyView, sliceInverters } from './test-helpers';
import { emptyEdit, type Finding, type Rule } from './types';

/** Proposes removing one slice's inverter transistor per slice (enough to exercise the engine). */
const perSlice = defineRule({
  id: 'test-per-slice',
  meta: {
    description: 'one finding per slice inverter',
    messages: { found: 'slice {slice} has its own inverter on {net}' },
    optionsSchema: z.object({ limit: z.number().int().min(1) }),
    defaultOptions: { limit: 10 },
  },
  find(ctx, options) {
    const qs = ctx.netlist.devices.filter((d) => d.kind === 'npn').slice(0, options.limit);
    for (const q of qs) {
      ctx.report({
        messageId: 'found',
        data: { slice: q.path.join('.'), net: 'LOAD' },
        location: { devices: [q.name], instances: [q.path.join('.')], nets: ['LOAD'] },
        proposals: [{ title: `remove ${q.name}`, edit: { ...emptyEdit(), removeDevices: [q.name] } }],
      });
    }
  },
});

const rule = (id: string, find: Rule['find'], messages: Record<string, string> = { m: 'message' }): Rule =>
  defineRule({ id, meta: { description: id, messages, optionsSchema: z.object({}), defaultOptions: {} }, find });

describe('defineRule and messages', () => {
  it('fills placeholders and refuses unknown ids and missing data', () => {
    expect(renderMessage('r', { a: '{n} gates on {net}' }, 'a', { n: 4, net: 'EN' })).toBe('4 gates on EN');
    expect(() => renderMessage('r', { a: 'x' }, 'b')).toThrow(InternalError);
    expect(() => renderMessage('r', { a: '{n}' }, 'a', {})).toThrow(/needs \{n\}/);
  });
  it('refuses rules whose defaults break their own schema', () => {
    expect(() =>
      defineRule({ id: 'bad-defaults', meta: { description: '', messages: { m: '' }, optionsSchema: z.object({ n: z.number() }), defaultOptions: { n: 'x' } as never }, find() {} }),
    ).toThrow(InternalError);
  });
});

describe('runRules', () => {
  it('reports findings with rendered messages and one proposal id per finding', async () => {
    const r = await runRules(sliceInverters(4), emptyView(), { rules: { [perSlice.id]: perSlice } });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toHaveLength(4);
    expect(r.findings[0].message).toBe('slice XS0 has its own inverter on LOAD');
    expect(r.findings[0].proposals[0].id).toBe(r.findings[0].id);
    expect(new Set(r.findings.map((f) => f.id)).size).toBe(4);
  });

  it('gives the same ids for the same design', async () => {
    const a = await runRules(sliceInverters(3), emptyView(), { rules: { [perSlice.id]: perSlice } });
    const b = await runRules(sliceInverters(3), emptyView(), { rules: { [perSlice.id]: perSlice } });
    expect(a.findings.map((f) => f.id)).toEqual(b.findings.map((f) => f.id));
    expect(stableHash('abc')).toBe(stableHash('abc'));
    expect(stableHash('abc')).not.toBe(stableHash('abd'));
  });

  it('passes options merged over defaults and refuses invalid ones as input errors', async () => {
    const rules = { [perSlice.id]: perSlice };
    const r = await runRules(sliceInverters(4), emptyView(), { rules, ruleOptions: { 'test-per-slice': { limit: 2 } } });
    expect(r.findings).toHaveLength(2);
    await expect(runRules(sliceInverters(2), emptyView(), { rules, ruleOptions: { 'test-per-slice': { limit: 0 } } })).rejects.toThrow(InputError);
    await expect(runRules(sliceInverters(2), emptyView(), { rules, enabled: ['no-such-rule'] })).rejects.toThrow(/unknown rule/);
  });

  it('records a crashing rule as a rule error and keeps the other rules’ findings', async () => {
    const crash = rule('test-crash', () => {
      throw new Error('boom');
    });
    const r = await runRules(sliceInverters(2), emptyView(), { rules: { [crash.id]: crash, [perSlice.id]: perSlice } });
    expect(r.ruleErrors).toEqual([{ ruleId: 'test-crash', message: 'rule test-crash: boom' }]);
    expect(r.findings).toHaveLength(2);
  });

  it('records an unknown message id as that rule’s error', async () => {
    const wrongId = rule('test-wrong-id', (ctx) => ctx.report({ messageId: 'nope', location: {}, proposals: [] }));
    const r = await runRules(sliceInverters(1), emptyView(), { rules: { [wrongId.id]: wrongId } });
    expect(r.ruleErrors[0].message).toMatch(/unknown message id "nope"/);
    expect(r.findings).toEqual([]);
  });

  it('freezes the design: a rule that mutates it fails and the design is unchanged', async () => {
    const nl = sliceInverters(2);
    const before = nl.devices.length;
    const mutator = rule('test-mutator', (ctx) => {
      (ctx.netlist.devices as unknown as unknown[]).push({});
    });
    const mapMutator = rule('test-map-mutator', (ctx) => {
      ctx.netlist.netByName.set('X', 99);
    });
    const r = await runRules(nl, emptyView(), { rules: { [mutator.id]: mutator, [mapMutator.id]: mapMutator } });
    expect(r.ruleErrors.map((e) => e.ruleId)).toEqual(['test-mutator', 'test-map-mutator']);
    expect(nl.devices.length).toBe(before);
    expect(nl.netByName.has('X')).toBe(false);
  });

  it('records proposals that do not fit the design', async () => {
    const ghost = rule('test-ghost', (ctx) =>
      ctx.report({ messageId: 'm', location: { devices: ['QX'] }, proposals: [{ title: 't', edit: { ...emptyEdit(), removeDevices: ['QX'] } }] }),
    );
    const needy = rule('test-needy', (ctx) =>
      ctx.report({ messageId: 'm', location: {}, proposals: [{ title: 't', edit: emptyEdit(), assumptions: ['A9'] }] }),
    );
    const r = await runRules(sliceInverters(1), emptyView(), { rules: { [ghost.id]: ghost, [needy.id]: needy } });
    expect(r.ruleErrors.map((e) => e.message)).toEqual([
      expect.stringMatching(/removes unknown device QX/),
      expect.stringMatching(/unknown assumption A9/),
    ]);
    expect(r.ruleErrors[0].element).toBe('QX');
  });

  it('detects overlapping proposals as a graph', async () => {
    const twice = rule('test-twice', (ctx) => {
      for (const title of ['first', 'second']) {
        ctx.report({
          messageId: 'm',
          location: { devices: [title] },
          proposals: [{ title, edit: { ...emptyEdit(), removeDevices: ['XS0.Q1'], mergeNets: title === 'first' ? [{ keep: 'LOAD', remove: 'XS1.B' }] : [] } }],
        });
      }
      ctx.report({ messageId: 'm', location: { devices: ['third'] }, proposals: [{ title: 'third', edit: { ...emptyEdit(), removeDevices: ['XS1.Q1'] } }] });
    });
    const r = await runRules(sliceInverters(2), emptyView(), { rules: { [twice.id]: twice } });
    expect(r.overlaps.nodes).toHaveLength(3);
    expect(r.overlaps.edges).toEqual([{ a: r.findings[0].id, b: r.findings[1].id, devices: ['XS0.Q1'], nets: [] }]);
  });
});

/** The overlap graph as a plain reading of its contract: every pair by shared names, in name order. */
function overlapReference(findings: Finding[]): OverlapGraph {
  const proposals = findings.flatMap((f) => f.proposals);
  const sets = proposals.map((p) => touched(p.edit));
  const byKey = new Map<string, number[]>();
  sets.forEach((s, i) => {
    for (const k of [...[...s.devices, ...s.added].map((d) => `d:${d}`), ...[...s.nets].map((n) => `n:${n}`)]) {
      const list = byKey.get(k) ?? [];
      if (list[list.length - 1] !== i) list.push(i);
      byKey.set(k, list);
    }
  });
  const seen = new Set<string>();
  const edges: OverlapGraph['edges'] = [];
  for (const list of byKey.values()) {
    for (let x = 0; x < list.length; x++) {
      for (let y = x + 1; y < list.length; y++) {
        if (seen.has(`${list[x]}:${list[y]}`)) continue;
        seen.add(`${list[x]}:${list[y]}`);
        edges.push({ a: proposals[list[x]].id, b: proposals[list[y]].id, ...overlapOf(sets[list[x]], sets[list[y]]) });
      }
    }
  }
  return { nodes: proposals.map((p) => p.id), edges };
}

describe('overlap graph', () => {
  it('matches the plain reading on random edits, with and without the netlist to number names', () => {
    const nl = sliceInverters(4);
    const devs = nl.devices.map((d) => d.name);
    const nets = nl.nets.map((n) => n.name);
    // names the design has and names it lacks (added parts, misspelt nets), repeats included
    const devPool = [...devs, 'NEW1', 'NEW2'];
    const netPool = [...nets, 'NOWHERE'];
    let seed = 7;
    const rand = (n: number) => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) % n);
    const pick = <T>(xs: T[], n: number) => Array.from({ length: n }, () => xs[rand(xs.length)]);
    let edgesSeen = 0;
    for (let round = 0; round < 60; round++) {
      const findings: Finding[] = Array.from({ length: 1 + rand(5) }, (_, f) => ({
        id: `f${f}`,
        ruleId: 'test',
        messageId: 'm',
        data: {},
        message: '',
        location: { devices: [], instances: [], nets: [] },
        proposals: Array.from({ length: 1 + rand(3) }, (_, k) => ({
          id: `f${f}.${k}`,
          title: '',
          assumptions: [],
          margins: [],
          edit: {
            ...emptyEdit(),
            removeDevices: pick(devPool, rand(4)),
            reconnect: pick(devPool, rand(2)).map((device) => ({ device, terminal: 0, net: 'LOAD' })),
            addDevices: pick(['NEW1', 'NEW2', devs[0]], rand(2)).map((name) => ({ name, kind: 'resistor' as const, terminals: ['A', 'B'], path: [] })),
            mergeNets: pick(netPool, rand(3)).map((keep) => ({ keep, remove: netPool[rand(netPool.length)] })),
          },
        })),
      }));
      const want = overlapReference(findings);
      expect(overlapGraph(findings)).toEqual(want);
      expect(overlapGraph(findings, nl)).toEqual(want);
      edgesSeen += want.edges.length;
    }
    expect(edgesSeen).toBeGreaterThan(30); // the rounds do overlap
  });
});
