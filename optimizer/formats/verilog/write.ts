// Writes the gate-level view of a design as structural Verilog (IEEE 1364): one module per cell,
// bit-level ports, gate primitives, pullups and positional instances. Names that are not plain
// identifiers (bus bits "A[3]", deck names) are written as escaped identifiers. Transistor-level
// devices and latches have no structural primitive here and are refused with a clear message.
import { own } from '../../netlist/own';
import { InputError } from '../../errors';
import type { Cell, Design } from '../../netlist/ir';

const KEYWORDS = new Set([
  'module', 'endmodule', 'input', 'output', 'inout', 'wire', 'tri', 'wand', 'wor', 'supply0', 'supply1', 'reg', 'assign',
  'and', 'or', 'nand', 'nor', 'xor', 'xnor', 'not', 'buf', 'bufif0', 'bufif1', 'notif0', 'notif1', 'pullup', 'pulldown',
  'always', 'initial', 'begin', 'end', 'if', 'else', 'case', 'parameter', 'integer', 'function', 'task', 'nmos', 'pmos',
]);

export function verilogName(name: string): string {
  if (/^[A-Za-z_][A-Za-z0-9_$]*$/.test(name) && !KEYWORDS.has(name)) return name;
  return `\\${name.replace(/\s/g, '_')} `;
}

export function writeVerilog(design: Design): string {
  const refused: string[] = [];
  for (const c of Object.values(design.cells)) {
    for (const d of c.devices) {
      if (d.kind !== 'gate') refused.push(`${d.name} (${d.kind})`);
      else if (d.op === 'latch' || d.op === 'dff') refused.push(`${d.name} (${d.op})`);
    }
  }
  if (refused.length > 0) {
    const shown = refused.slice(0, 5).join(', ') + (refused.length > 5 ? `, and ${refused.length - 5} more` : '');
    throw InputError.at(
      'verilog.write-kind',
      `only gate-level devices can be written as structural Verilog: ${shown}. Export transistor-level designs as a SPICE deck or JSON`,
    );
  }
  const out = [`// ${design.title.replace(/[\r\n]+/g, ' ')}`];
  // Children first, the top module last.
  const cells = Object.values(design.cells).sort((a, b) => Number(a.name === design.top) - Number(b.name === design.top));
  for (const c of cells) out.push(moduleText(c));
  return out.join('\n') + '\n';
}

function moduleText(cell: Cell): string {
  const v = verilogName;
  const lines = [`module ${v(cell.name)} (${cell.ports.map(v).join(', ')});`];
  for (const p of cell.ports) lines.push(`  ${own(cell.directions, p) ?? 'inout'} ${v(p)};`);
  const ports = new Set(cell.ports);
  const nets = new Set<string>();
  for (const d of cell.devices) for (const t of d.terminals) nets.add(t);
  for (const i of cell.instances) for (const t of i.connections) nets.add(t);
  for (const [n, kind] of Object.entries(cell.netKinds ?? {})) {
    if (kind !== 'wire') lines.push(`  ${kind} ${v(n)};`);
    nets.delete(n);
  }
  for (const n of nets) if (!ports.has(n)) lines.push(`  wire ${v(n)};`);
  for (const d of cell.devices) lines.push(`  ${d.op} ${v(d.name)} (${d.terminals.map(v).join(', ')});`);
  for (const i of cell.instances) lines.push(`  ${v(i.cell)} ${v(i.name)} (${i.connections.map(v).join(', ')});`);
  lines.push('endmodule');
  return lines.join('\n');
}
