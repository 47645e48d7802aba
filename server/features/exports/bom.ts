// Bill of materials as CSV: one line per part kind and value/model, with quantity, references,
// footprint, unit price and extended price from the parts table (the defaults are invented demo prices).
import { partKindOf } from '@/optimizer/cost/cost';
import { DEFAULT_PARTS_TABLE, type PartsTable } from '@/optimizer/cost/parts-table';
import type { FlatNetlist } from '@/optimizer/netlist/ir';

function csvCell(s: string | number): string {
  const t = String(s);
  // Quote anything a spreadsheet could misread, and defuse formula prefixes.
  const safe = /^[=+\-@\t\r]/.test(t) ? `'${t}` : t;
  return /[",\n\r]/.test(safe) || safe !== t ? `"${safe.replace(/"/g, '""')}"` : safe;
}

function valueOf(d: FlatNetlist['devices'][number]): string {
  if (d.kind === 'gate') return d.op ?? 'gate';
  if (d.model) return d.model;
  if (d.value !== undefined) return formatEng(d.value, d.kind === 'resistor' ? 'Ω' : d.kind === 'capacitor' ? 'F' : '');
  return '';
}

function formatEng(x: number, unit: string): string {
  const steps: [number, string][] = [[1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n'], [1e-12, 'p']];
  const a = Math.abs(x);
  for (const [f, p] of steps) if (a >= f) return `${Number((x / f).toPrecision(4))}${p}${unit}`;
  return `${x}${unit}`;
}

export function bomCsv(flat: FlatNetlist, table: PartsTable = DEFAULT_PARTS_TABLE): string {
  const groups = new Map<string, { kind: string; value: string; refs: string[] }>();
  for (const d of flat.devices) {
    const kind = partKindOf(d);
    if (!kind) continue;
    const value = valueOf(d);
    const key = `${kind}\u0000${value}`;
    const g = groups.get(key) ?? { kind, value, refs: [] };
    g.refs.push(d.name);
    groups.set(key, g);
  }
  const lines = [['part kind', 'value/model', 'quantity', 'refs', 'footprint', `unit price (${table.currency})`, `extended (${table.currency})`].map(csvCell).join(',')];
  let total = 0;
  for (const g of [...groups.values()].sort((a, b) => a.kind.localeCompare(b.kind) || a.value.localeCompare(b.value))) {
    const entry = table.parts[g.kind as keyof PartsTable['parts']];
    const extended = Math.round(entry.price * g.refs.length * 1e4) / 1e4;
    total += extended;
    lines.push([g.kind, g.value, g.refs.length, g.refs.join(' '), entry.footprint, entry.price, extended].map(csvCell).join(','));
  }
  lines.push(['total', '', '', '', '', '', Math.round(total * 1e4) / 1e4].map(csvCell).join(','));
  lines.push(csvCell(`Prices: ${table.note}`));
  return lines.join('\r\n') + '\r\n';
}
