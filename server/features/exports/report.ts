// The review report of a revision, as Markdown and as a printable HTML page (every value escaped):
// part counts, each proposal with its evidence, margins and decisions, and the cautions.
import type { ProposalDetail } from '@/shared/api/proposals';
import type { Revision } from '@/shared/api/revisions';
import { CAUTIONS } from '@/server/features/proposals/service';

export type ReportInput = { designName: string; family: string; revision: Revision; proposals: ProposalDetail[]; generatedAt: Date };

const mdEscape = (s: string) => s.replace(/([\\`*_{}[\]()#+\-!|<>])/g, '\\$1');

function savingsLine(p: ProposalDetail): string {
  const s = p.savings;
  return `${s.parts} parts (${s.transistors} transistors, ${s.resistors} resistors, ${s.diodes} diodes), ${s.areaMm2} mm², ${s.cost}`;
}

export function reportMarkdown(r: ReportInput): string {
  const c = r.revision.partCounts;
  const out: string[] = [
    `# Review report — ${mdEscape(r.designName)}, revision ${r.revision.number}`,
    '',
    `Family: ${r.family}. Generated ${r.generatedAt.toISOString()}. Source sha256 \`${r.revision.sha256}\`.`,
    '',
    `Parts: ${c.transistors} transistors, ${c.resistors} resistors, ${c.diodes} diodes, ${c.capacitors} capacitors, ${c.gates} gates (${c.total} in all).`,
    '',
    '## Cautions',
    '',
    ...CAUTIONS.map((x) => `- ${x}`),
    '',
    `## Proposals (${r.proposals.length})`,
  ];
  if (!r.proposals.length) out.push('', 'No proposals were recorded for this revision.');
  for (const p of r.proposals) {
    out.push('', `### ${mdEscape(p.title)}`, '', `- Rule: ${p.ruleId}; status: **${p.status}**; readiness: ${p.readiness}`, `- ${mdEscape(p.message)}`, `- Saves: ${savingsLine(p)}`);
    const ev = p.evidence;
    out.push(`- Evidence: ${ev.verdict} by ${ev.method}${ev.assumptionsUsed.length ? ` under ${ev.assumptionsUsed.map((a) => `\`${a.expression}\``).join(', ')}` : ''}${ev.note ? ` — ${mdEscape(ev.note)}` : ''}`);
    if (ev.counterexample) {
      out.push(`- Counterexample: ${Object.entries(ev.counterexample.inputs).map(([k, v]) => `${k}=${v}`).join(', ')}; ${ev.counterexample.outputs.map((o) => `${o.name} ${o.before}→${o.after}`).join(', ')}`);
    }
    if (p.margins.length) {
      out.push('', '| margin | value | limit | unit | status | corner |', '|---|---|---|---|---|---|');
      for (const m of p.margins) out.push(`| ${mdEscape(m.name)} | ${m.value} | ${m.limit} | ${m.unit} | ${m.status} | supply ${m.corner.supply} V, ${mdEscape(m.corner.resistors)}${m.corner.beta ? `, β ${m.corner.beta}` : ''} |`);
    }
    for (const d of p.decisions) out.push(`- Decision: **${d.decision}** by ${mdEscape(d.reviewer)} at ${d.at}${d.reason ? ` — ${mdEscape(d.reason)}` : ''}`);
  }
  return out.join('\n') + '\n';
}

const h = (s: string | number) => String(s).replace(/[&<>"']/g, (ch) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[ch]!);

export function reportHtml(r: ReportInput): string {
  const c = r.revision.partCounts;
  const parts: string[] = [];
  for (const p of r.proposals) {
    const ev = p.evidence;
    parts.push(`<section class="proposal"><h3>${h(p.title)}</h3>
<p>Rule ${h(p.ruleId)} · status <strong>${h(p.status)}</strong> · readiness ${h(p.readiness)}</p>
<p>${h(p.message)}</p>
<p>Saves ${h(savingsLine(p))}</p>
<p>Evidence: ${h(ev.verdict)} by ${h(ev.method)}${ev.assumptionsUsed.length ? ` under ${ev.assumptionsUsed.map((a) => `<code>${h(a.expression)}</code>`).join(', ')}` : ''}${ev.note ? ` — ${h(ev.note)}` : ''}</p>
${ev.counterexample ? `<p>Counterexample: ${h(Object.entries(ev.counterexample.inputs).map(([k, v]) => `${k}=${v}`).join(', '))}; ${h(ev.counterexample.outputs.map((o) => `${o.name} ${o.before}→${o.after}`).join(', '))}</p>` : ''}
${p.margins.length ? `<table><thead><tr><th>margin</th><th>value</th><th>limit</th><th>unit</th><th>status</th><th>corner</th></tr></thead><tbody>${p.margins.map((m) => `<tr><td>${h(m.name)}</td><td>${h(m.value)}</td><td>${h(m.limit)}</td><td>${h(m.unit)}</td><td>${h(m.status)}</td><td>supply ${h(m.corner.supply)} V, ${h(m.corner.resistors)}${m.corner.beta ? `, β ${h(m.corner.beta)}` : ''}</td></tr>`).join('')}</tbody></table>` : ''}
${p.decisions.map((d) => `<p class="decision">Decision: <strong>${h(d.decision)}</strong> by ${h(d.reviewer)} at ${h(d.at)}${d.reason ? ` — ${h(d.reason)}` : ''}</p>`).join('\n')}
</section>`);
  }
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>Review report — ${h(r.designName)}, revision ${r.revision.number}</title>
<style>
body { font: 11pt/1.45 system-ui, sans-serif; margin: 2cm; color: #111; }
table { border-collapse: collapse; margin: 0.5em 0; } td, th { border: 1px solid #999; padding: 2px 6px; font-size: 10pt; }
.cautions { border: 2px solid #a60; padding: 0.5em 1em; } section.proposal { break-inside: avoid; border-top: 1px solid #ccc; }
@media print { body { margin: 1cm; } }
</style></head><body>
<h1>Review report — ${h(r.designName)}, revision ${r.revision.number}</h1>
<p>Family ${h(r.family)}. Generated ${h(r.generatedAt.toISOString())}. Source sha256 <code>${h(r.revision.sha256)}</code>.</p>
<p>Parts: ${c.transistors} transistors, ${c.resistors} resistors, ${c.diodes} diodes, ${c.capacitors} capacitors, ${c.gates} gates (${c.total} in all).</p>
<div class="cautions"><h2>Cautions</h2><ul>${CAUTIONS.map((x) => `<li>${h(x)}</li>`).join('')}</ul></div>
<h2>Proposals (${r.proposals.length})</h2>
${parts.join('\n') || '<p>No proposals were recorded for this revision.</p>'}
</body></html>
`;
}
