// The scan and apply commands: the JSON shape the issue names, the readable table, the same ids
// from scan and apply, the applied deck's part counts against the stated savings, and refusals
// (overlap, unknown id, unknown net in an assumption, refuted finding) with exit 2.
import { describe, expect, it } from 'vitest';
import { runCli, type CliIo } from './cli';
import { writeSpice } from './formats/spice/write';
import { readSpice } from './formats/spice/read';
import { countFlat } from './netlist/counts';
import { flatten } from './netlist/flatten';
import { generateBitSliced } from './netlist/generate';

/** Wren-8 style register of four RTL slices: every slice has its own enable inverter on LOAD. */
const deck = writeSpice(generateBitSliced({ slices: 4, family: 'rtl' }));

function fakeIo() {
  const out: string[] = [];
  const err: string[] = [];
  const written: Record<string, string> = {};
  const io: CliIo = {
    readFile: (p) => {
      if (p === 'reg.cir') return new TextEncoder().encode(deck);
      throw Object.assign(new Error('missing'), { code: 'ENOENT' });
    },
    writeFile: (p, t) => {
      written[p] = t;
    },
    stdout: (t) => out.push(t),
    stderr: (t) => err.push(t),
  };
  return { io, out, err, written };
}

const RULES = ['--rules', 'shared-control-driver,merge-duplicate-logic'];

interface JsonFinding {
  id: string;
  rule: string;
  savings: { transistors: number; resistors: number; diodes: number; areaMm2: number; cost: number };
  verification: { status: string; method: string; assumptions: string[] };
  margins: { name: string; status: string; corner: string }[];
  verdict: string;
}

async function scanJson(extra: string[] = []) {
  const { io, out, err } = fakeIo();
  const code = await runCli(['scan', 'reg.cir', ...RULES, '--json', ...extra], io);
  expect(err.join('')).toBe('');
  expect(code).toBe(0);
  return JSON.parse(out.join('')) as { parts: { transistors: number }; findings: JsonFinding[]; ruleErrors: unknown[] };
}

describe('trimwire scan', () => {
  it('--json gives parts, findings with savings, verification, margins and verdict', async () => {
    const j = await scanJson(['--assume', '!(LOAD & CLR)']);
    expect(j.parts.transistors).toBe(20);
    expect(j.ruleErrors).toEqual([]);
    const shared = j.findings.find((f) => f.rule === 'shared-control-driver')!;
    // four enable inverters (one transistor, two resistors each) become one: 3 T and 6 R saved
    expect(shared.savings).toMatchObject({ transistors: 3, resistors: 6, diodes: 0 });
    expect(shared.verification).toMatchObject({ status: 'proved' });
    expect(shared.verdict).toBe('ready');
    expect(shared.margins.map((m) => m.name)).toContain('fan-out');
    expect(shared.margins.every((m) => typeof m.corner === 'string' && ['pass', 'warn', 'fail'].includes(m.status))).toBe(true);
  });

  it('prints a readable table by default', async () => {
    const { io, out } = fakeIo();
    expect(await runCli(['scan', 'reg.cir', ...RULES, '--assume', '!(LOAD & CLR)'], io)).toBe(0);
    const text = out.join('');
    expect(text).toMatch(/^reg\.cir: 20 transistors/);
    expect(text).toMatch(/assuming A1: !\(LOAD & CLR\)/);
    expect(text).toMatch(/shared-control-driver-\w+ +shared-control-driver +ready +proved/);
    expect(text).toMatch(/data sheets/);
  });

  it('refuses an assumption over a net the design lacks, a bad clock period and an unknown rule', async () => {
    const a = fakeIo();
    expect(await runCli(['scan', 'reg.cir', '--assume', 'LOAD & NOPE'], a.io)).toBe(2);
    expect(a.err.join('')).toMatch(/NOPE/);
    const b = fakeIo();
    expect(await runCli(['scan', 'reg.cir', '--clock-period', 'soon'], b.io)).toBe(1);
    const c = fakeIo();
    expect(await runCli(['scan', 'reg.cir', '--rules', 'no-such-rule'], c.io)).toBe(2);
    expect(c.err.join('')).toMatch(/unknown rule id/);
    const d = fakeIo();
    expect(await runCli(['scan', 'reg.cir', '--assume', 'LOAD & !LOAD'], d.io)).toBe(2);
  });
});

describe('trimwire apply', () => {
  it('writes the deck with the finding applied; its part counts drop by the stated savings', async () => {
    const j = await scanJson();
    const shared = j.findings.find((f) => f.rule === 'shared-control-driver')!;
    const { io, out, written } = fakeIo();
    expect(await runCli(['apply', 'reg.cir', ...RULES, '--finding', shared.id, '--out', 'slim.cir'], io)).toBe(0);
    expect(out.join('')).toMatch(new RegExp(`applied ${shared.id}`));
    const before = countFlat(flatten(readSpice(deck, 'reg.cir').design));
    const after = countFlat(flatten(readSpice(written['slim.cir'], 'slim.cir').design));
    expect(before.transistors - after.transistors).toBe(shared.savings.transistors);
    expect(before.resistors - after.resistors).toBe(shared.savings.resistors);
  });

  it('refuses overlapping findings, unknown ids and a missing --out without writing anything', async () => {
    const j = await scanJson();
    const ids = j.findings.map((f) => f.id);
    expect(ids.length).toBeGreaterThanOrEqual(2);
    const a = fakeIo();
    expect(await runCli(['apply', 'reg.cir', ...RULES, '--proposals', ids.join(','), '--out', 'x.cir'], a.io)).toBe(2);
    expect(a.err.join('')).toMatch(/overlap/);
    expect(a.written).toEqual({});
    const b = fakeIo();
    expect(await runCli(['apply', 'reg.cir', ...RULES, '--finding', 'shared-control-driver-00000000', '--out', 'x.cir'], b.io)).toBe(2);
    expect(b.err.join('')).toMatch(/no finding shared-control-driver-00000000/);
    const c = fakeIo();
    expect(await runCli(['apply', 'reg.cir', '--finding', ids[0]], c.io)).toBe(1);
    expect({ ...a.written, ...b.written, ...c.written }).toEqual({});
  });
});
